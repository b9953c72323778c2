/** Speed of light in vacuum, m/s, exact by definition of the metre (SI Brochure, 9th ed., 2019). */
export const C = 299_792_458;

export const MM = 1e-3;
export const INCH = 0.0254;
export const DEG = Math.PI / 180;

export const MAX_FORMULA_LENGTH = 500;
export const MAX_ROWS = 200;
export const MAX_PARAMETERS = 200;
/** Above 1 THz the free-space wavelength is under 0.3 mm; no design here is meant for that. */
export const MAX_FREQUENCY_HZ = 1e12;

export const KEY_PATTERN = /^[a-z_][a-z0-9_]{0,39}$/i;

/** Names every formula sees; a parameter or row key may not take them. */
export const SCOPE_NAMES = ['f', 'lambda', 'c', 'pi', 'e', 'tau'] as const;

/** Words the mathjs parser treats as operators or literals, so a key with this name could never be read. */
export const PARSER_WORDS = [
	'to',
	'in',
	'and',
	'or',
	'not',
	'xor',
	'mod',
	'true',
	'false',
	'null',
	'undefined',
	'Infinity',
	'NaN'
] as const;
