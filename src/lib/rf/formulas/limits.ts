/** Bounds and reserved names of formulas and tables: sizes, key shape, names every formula sees. */
export const MAX_FORMULA_LENGTH = 500;
export const MAX_ROWS = 200;
export const MAX_PARAMETERS = 200;
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
