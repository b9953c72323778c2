/** Speed of light in vacuum, m/s, exact by definition of the metre (SI Brochure, 9th ed., 2019). */
export const C = 299_792_458;

/** Millimetres per inch, exact by definition (international inch, 1959). */
export const MM_PER_INCH = 25.4;

export const DEG = Math.PI / 180;
