import { describe, expect, it } from 'vitest';
import { C } from '../units/constants';
import { compileFormula, formulaCacheStats, scanNames } from './formula';
import type { CompileScope, ScopeEntry } from './types';
import { DIMLESS, FREQUENCY, LENGTH, SPEED, ANGLE, type Dims } from './dims';
import { referenceEvaluate, referenceUnit } from './sandbox';

/** Scope of the test formulas; SI values with their mathjs equivalents for the reference run. */
const PARAMS: [string, number, Dims, () => unknown][] = [
	['er', 2.2, DIMLESS, () => 2.2],
	['vf', 0.66, DIMLESS, () => 0.66],
	['h', 1.6e-3, LENGTH, () => referenceUnit(1.6, 'mm')],
	['wire', 2e-3, LENGTH, () => referenceUnit(2, 'mm')],
	['d', 84e-3, LENGTH, () => referenceUnit(84, 'mm')],
	['pitch', (14 * Math.PI) / 180, ANGLE, () => referenceUnit(14, 'deg')]
];

function scope(): { scope: CompileScope; entries: Map<string, ScopeEntry> } {
	const entries = new Map<string, ScopeEntry>([
		['f', { slot: 0, dims: FREQUENCY }],
		['lambda', { slot: 1, dims: LENGTH }],
		['c', { slot: 2, dims: SPEED }]
	]);
	PARAMS.forEach(([k, , dims], i) => entries.set(k, { slot: 3 + i, dims }));
	return { entries, scope: { lookup: (n) => entries.get(n), refuse: () => undefined } };
}

function env(fHz: number): Float64Array {
	const e = new Float64Array(3 + PARAMS.length);
	e.set([fHz, C / fHz, C]);
	PARAMS.forEach(([, v], i) => (e[3 + i] = v));
	return e;
}

function compileOk(text: string) {
	const r = compileFormula(text, scope().scope);
	if (!r.ok) throw new Error(`${text}: ${r.error.message}`);
	return r.expr;
}

function compileErr(text: string) {
	const r = compileFormula(text, scope().scope);
	if (r.ok) throw new Error(`${text} compiled`);
	return r.error;
}

function reference(text: string, fHz: number): number {
	const s = new Map<string, unknown>([
		['f', referenceUnit(fHz, 'Hz')],
		['lambda', referenceUnit(C / fHz, 'm')],
		['c', referenceUnit(C, 'm/s')]
	]);
	for (const [k, , , mk] of PARAMS) s.set(k, mk());
	const out = referenceEvaluate(text, s) as number | { value: number };
	return typeof out === 'number' ? out : out.value;
}

const FORMULAS = [
	'lambda / 4',
	'0.5 * lambda * vf',
	'1.5 mm',
	'sqrt(er)',
	'lambda / 4 + wire / 2',
	'(lambda / 4) to mm',
	'lambda / 4 in in',
	'c / f',
	'c / (2 * f) * sqrt(2 / (er + 1))',
	'patch_width(f, er)',
	'patch_length(f, er, h)',
	'patch_eeff(er, h, patch_width(f, er))',
	'patch_dl(h, patch_width(f, er), 2)',
	'lambda * sin(pitch)',
	'lambda * cos(14 deg)',
	'lambda * tan(pitch) / pi',
	'atan(h / lambda)',
	'atan2(1.6, 2)',
	'abs(h - lambda)',
	'max(lambda / 10, 10 mm)',
	'min(h, wire, 3 mm)',
	'pow(lambda, 2) / h',
	'sqrt(lambda * h)',
	'(lambda ^ 2 + h ^ 2) ^ 0.5',
	'exp(-h / lambda)',
	'log(lambda / h)',
	'log(lambda / h, 2)',
	'log10(f / 1 GHz)',
	'round(f / 1 MHz)',
	'floor(lambda / 1 mm)',
	'ceil(lambda / h)',
	'f > 3 GHz ? lambda / 2 : lambda / 4',
	'-lambda / 4 + 2 cm',
	'2 lambda / 3',
	'lambda_in(f, vf) / 4',
	'guide_wavelength(f, d)',
	'te11_cutoff(d) / 1 GHz',
	'c / tm01_cutoff(d)',
	'vf_from_er(er) * lambda',
	'rl_from_vswr(1.5) + mismatch_loss(2) + gamma_from_vswr(3) + vswr_from_rl(10)',
	'snap(wire * 0.8, "awg")',
	'1 in + 3 mm',
	'12.9 mm * (5.8 GHz / f)',
	'asin(0.5) rad to deg',
	'(f < 5 GHz and f > 2.5 GHz) ? h : wire',
	'not (f > 4 GHz) ? 1 mm : 2 mm',
	'2 pi * lambda / tau',
	'e ^ 2 * 1 mm'
];

describe('fast path agrees with mathjs evaluating the same formula with units', () => {
	let seed = 12345;
	const random = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
	const freqs = Array.from({ length: 12 }, () => 2.2e9 + random() * 7.8e9);

	it.each(FORMULAS)('%s', (text) => {
		const expr = compileOk(text);
		for (const f of freqs) {
			const fast = expr.run(env(f));
			const ref = reference(text, f);
			expect(Math.abs(fast - ref)).toBeLessThanOrEqual(1e-9 * Math.max(Math.abs(ref), 1e-12));
		}
	});

	it('covers at least 30 formulas', () => {
		expect(FORMULAS.length).toBeGreaterThanOrEqual(30);
	});
});

describe('dimensions', () => {
	it.each([
		['lambda / 4', LENGTH],
		['f', FREQUENCY],
		['sqrt(lambda * h)', LENGTH],
		['pow(lambda, 2)', [0, 2, 0, 0, 0, 0, 0, 0, 0]],
		['14 deg', ANGLE],
		['sin(14 deg)', DIMLESS],
		['c / f', LENGTH],
		['te11_cutoff(d)', FREQUENCY]
	] as [string, Dims][])('%s', (text, dims) => {
		expect(compileOk(text).dims).toEqual(dims);
	});

	it('folds unit literals and constants at compile time', () => {
		// 1.5 mm is 0.0015 m; 14 deg is 14π/180 rad.
		expect(compileOk('1.5 mm').k).toBeCloseTo(0.0015, 15);
		expect(compileOk('14 deg').k).toBeCloseTo((14 * Math.PI) / 180, 15);
		expect(compileOk('lambda / 4').k).toBeUndefined();
	});
});

describe('located errors', () => {
	it('unknown name, with its column', () => {
		expect(compileErr('lambda / 4 + foo')).toEqual({ message: 'unknown name "foo"', column: 14 });
	});

	it('syntax errors carry the column mathjs reports', () => {
		expect(compileErr('sqrt(2 +')).toMatchObject({ column: 9 });
		expect(compileErr('2 @ 3')).toMatchObject({ column: 3 });
		expect(compileErr('sqrt(2 +').message).toMatch(/^syntax error/);
	});

	it('adding incompatible dimensions', () => {
		const e = compileErr('lambda + 1 GHz');
		expect(e.message).toBe('cannot add length (lambda) and frequency (1 GHz)');
		expect(e.column).toBeGreaterThan(6);
	});

	it('bad units and conversions', () => {
		expect(compileErr('3 zorgs')).toEqual({ message: 'unknown name "zorgs"', column: 3 });
		expect(compileErr('lambda to GHz').message).toBe('cannot convert length (lambda) to GHz');
		expect(compileErr('lambda to 4').message).toMatch(/must be a unit/);
		expect(compileErr('20 degC').message).toMatch(/offset/);
	});

	it('function misuse', () => {
		expect(compileErr('sin(lambda)').message).toMatch(
			/sin needs an angle or a plain number, got length/
		);
		expect(compileErr('sqrt(1, 2)').message).toBe('sqrt takes 1 argument, got 2');
		expect(compileErr('er(2)').message).toBe('er is a value, not a function');
		expect(compileErr('sqrt').message).toMatch(/is a function/);
		expect(compileErr('patch_width(lambda, er)').message).toMatch(
			/argument 1 \(lambda\) should be frequency/
		);
		expect(compileErr('snap(lambda, "nails")').message).toBe('unknown catalogue "nails"');
		expect(compileErr('round(lambda)').message).toMatch(/round needs a plain number/);
		expect(compileErr('lambda ^ er').message).toMatch(/fixed number/);
	});

	it('constant formulas that fail are caught at compile time', () => {
		// 10 GHz is below the TE11 cutoff of a 1 cm guide (17.57 GHz, Pozar §3.4 [calc]).
		expect(compileErr('guide_wavelength(10 GHz, 1 cm)').message).toMatch(/below the TE11 cutoff/);
	});

	it('formula length limit', () => {
		expect(compileErr('1'.repeat(501)).message).toMatch(/limit is 500/);
		expect(compileErr('  ').message).toBe('formula is empty');
	});
});

describe('sandbox: each blocked attack', () => {
	const attacks: [string, RegExp][] = [
		['import({"x": 1}, {override: true})', /function import is not allowed/],
		['createUnit("x")', /function createUnit is not allowed/],
		['cos.constructor("return process")()', /syntax error|not allowed/],
		['cos.constructor', /property and index access/],
		['c = 3', /assignment/],
		['f(x) = x', /defining functions/],
		['ones(10000000)', /function ones is not allowed/],
		['zeros(10000, 1000)', /function zeros is not allowed/],
		['[1,2,3][1]', /not allowed/],
		['[1,2,3]', /matrices/],
		['__proto__', /unknown name "__proto__"/],
		['constructor', /unknown name "constructor"/],
		['toString', /unknown name "toString"/],
		['evaluate("1")', /function evaluate is not allowed/],
		['parse("1")', /function parse is not allowed/],
		['compile("1")', /function compile is not allowed/],
		['simplify("x")', /function simplify is not allowed/],
		['{a: 1}', /objects/],
		['1:1000000', /ranges/],
		['1; 2', /only one expression/],
		['x = 1\n2', /only one expression|assignment/],
		['"abc"', /text in quotes/],
		['speedOfLight', /not available/],
		['__proto__.polluted = 1', /assignment|not allowed/],
		['constructor.prototype.polluted = 1', /assignment|not allowed/]
	];

	it.each(attacks)('%s', (text, message) => {
		expect(compileErr(text).message).toMatch(message);
	});

	it('the mathjs instance itself has the dangerous functions disabled', () => {
		for (const text of [
			'evaluate("1")',
			'parse("1")',
			'import({}, {})',
			'createUnit("x")',
			'compile("1")'
		]) {
			expect(() => referenceEvaluate(text, new Map())).toThrow(/disabled/);
		}
	});

	it('deep nesting is bounded by the length limit and does not crash', () => {
		const deep = `${'('.repeat(240)}1 mm${')'.repeat(240)}`;
		expect(compileOk(deep).k).toBeCloseTo(0.001, 12);
		const minus = compileFormula(`${'-'.repeat(498)}1`, scope().scope);
		expect(minus.ok).toBe(true);
	});

	it('no prototype pollution after all of the above', () => {
		for (const [text] of attacks) compileFormula(text, scope().scope);
		expect(({} as Record<string, unknown>).polluted).toBeUndefined();
		expect(Object.prototype).not.toHaveProperty('polluted');
	});
});

describe('parse cache', () => {
	it('parses a formula text once', () => {
		const text = 'lambda / 4 + 0.123456 mm';
		compileOk(text);
		const before = formulaCacheStats().parses;
		for (let i = 0; i < 10; i++) compileOk(text);
		expect(formulaCacheStats().parses).toBe(before);
		expect(formulaCacheStats().size).toBeLessThanOrEqual(formulaCacheStats().limit);
	});

	it('scans names with their columns, skipping strings, numbers and keywords', () => {
		expect(scanNames('2e3 mm to in + snap(d, "awg")')).toEqual([
			{ name: 'mm', column: 5 },
			{ name: 'snap', column: 16 },
			{ name: 'd', column: 21 }
		]);
	});
});
