// Scripts run outside SvelteKit: the server modules read the same variables from the process.
export const env = process.env as Record<string, string | undefined>;
