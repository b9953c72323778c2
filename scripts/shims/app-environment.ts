export const dev = false;
export const building = false;
export const browser = false;
