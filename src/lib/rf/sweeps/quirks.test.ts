import Complex from 'complex.js';
import { describe, expect, it } from 'vitest';
import { gammaOf, grid, rlcEdges, rlcImpedance } from '../../testing/sweeps/rlc';
import { analyzeSweep, type AnalyzeResult } from './claim-check';
import { parseSweep } from './sweep';
import type { ParseSweepOptions, Sweep } from './types';

/*
 * Files as real instruments and tools write them, invented here: each quirk is reproduced on a
 * series RLC load whose metrics follow in closed form (testing/sweeps/rlc.ts, [calc] from Pozar,
 * Microwave Engineering, 4th ed., §2.3): with R = Z0, Γ = 0 and VSWR 1 at f0, and the VSWR ≤ 2
 * and ≤ 1.5 edges from rlcEdges. Touchstone rules: IBIS Touchstone File Format Specification
 * Rev 1.1 and Version 2.0 (option line, 2-port data order N11 N21 N12 N22, [Reference],
 * [Matrix Format], noise data); Z-parameters are normalized to R in 1.x files and in ohms in 2.0
 * files (from memory; scikit-rf's Touchstone reader treats them the same way).
 */

const F0 = 435e6;
const Q = 10;
const DEG = 180 / Math.PI;

function load(text: string, options: ParseSweepOptions = {}): Sweep {
	const r = parseSweep(text, options);
	if (!r.ok) throw new Error(`expected a sweep, got ${r.error.code}: ${r.error.message}`);
	return r.sweep;
}

const claim = { design_hz: F0, band_lo_hz: 425e6, band_hi_hz: 445e6, vswr_max: 2 };

/** The sweep carries exactly one note, without counts. */
function expectOnlyNote(a: AnalyzeResult, code: string, message: string) {
	expect(a.warnings).toEqual([
		{ code, message, count: null, max_excess: null, frequency_hz: null }
	]);
}

/** Metrics against the closed form of a series RLC with R = Z0 resonating at f0. */
function expectClosedForm(a: AnalyzeResult, f0: number, r: number, step: number) {
	expect(a.min_vswr).toBeCloseTo(1, 3);
	expect(Math.abs(a.f_min_vswr_hz - f0)).toBeLessThan(step);
	// linear interpolation between grid points of a smooth curve: far under 1 % of the step
	const tol = step / 100;
	for (const [vswr, bands] of [
		[2, a.bands_vswr_2],
		[1.5, a.bands_vswr_1_5]
	] as const) {
		const [lo, hi] = rlcEdges(f0, Q, r, vswr);
		expect(bands).toHaveLength(1);
		expect(Math.abs(bands[0][0] - lo)).toBeLessThan(tol);
		expect(Math.abs(bands[0][1] - hi)).toBeLessThan(tol);
	}
}

/** Touchstone 1.x MA lines (MHz) from Γ values. */
function maLines(f: Float64Array, g: Complex[], tail: (i: number) => string = () => ''): string[] {
	return Array.from(f, (hz, i) => `${hz / 1e6} ${g[i].abs()} ${g[i].arg() * DEG}${tail(i)}`);
}

describe('calibration noise: points just above |S11| = 1', () => {
	// Far from resonance the load reflects nearly all: |Γ| > 0.995 below 0.414 f0 and above 2.41 f0
	// [calc: |X| > 19.9 R]. There the "instrument" reads 0.4 % high, as a calibration can.
	const f = grid(100e6, 1500e6, 1401);
	const clean = Array.from(f, (hz) => gammaOf(rlcImpedance(hz, F0, Q, 50), 50));
	const noisy = clean.map((g) => (g.abs() > 0.995 ? g.mul(1.004) : g));
	const text = [
		'! invented: series RLC, 0.4 % calibration noise',
		'# MHz S MA R 50',
		...maLines(f, noisy)
	].join('\n');

	it('loads, flags the points above 1 and words a warning with count, excess and frequency', () => {
		const a = analyzeSweep(load(text), claim);
		const mags = noisy.map((g) => g.abs());
		const above = mags.filter((m) => m > 1 + 1e-9);
		const largest = Math.max(...mags);
		expect(above.length).toBeGreaterThan(10);
		expect(a.warnings).toHaveLength(1);
		const w = a.warnings[0];
		expect(w).toMatchObject({ code: 'above_unity', count: above.length });
		expect(w.max_excess).toBeCloseTo(largest - 1, 9);
		expect(w.frequency_hz).toBe(f[mags.indexOf(largest)]);
		expect(w.message).toMatch(new RegExp(`^${above.length} of 1401 points read \\|S11\\| above 1`));
		expect(w.message).toMatch(/calibration noise/);
		expect(w.message).toMatch(/VSWR there is off the scale/);
	});

	it('keeps the metrics of the clean load (closed form), VSWR off the scale where |S11| > 1', () => {
		const a = analyzeSweep(load(text), claim);
		expectClosedForm(a, F0, 50, 1e6);
		expect(a.claim?.pass).toBe(true);
		const i = a.series.f_hz.indexOf(100e6);
		expect(noisy[0].abs()).toBeGreaterThan(1);
		expect(a.series.vswr[i]).toBeNull();
		// return loss is shown as measured: slightly negative
		expect(a.series.rl_db[i]).toBeCloseTo(-20 * Math.log10(noisy[0].abs()), 9);
	});

	it('S11 in dB slightly above 0 in a CSV (return loss slightly negative) loads the same way', () => {
		const rows = Array.from(f, (hz, i) => `${hz / 1e6},${20 * Math.log10(noisy[i].abs())}`);
		const a = analyzeSweep(load(['Frequency (MHz),S11 (dB)', ...rows].join('\n')), claim);
		expect(a.warnings[0].code).toBe('above_unity');
		expectClosedForm(a, F0, 50, 1e6);
	});
});

describe('one wild outlier', () => {
	const f = grid(300e6, 600e6, 3001);
	const g = Array.from(f, (hz) => gammaOf(rlcImpedance(hz, F0, Q, 50), 50));
	const k = 1400; // 440 MHz, inside the VSWR ≤ 2 band
	g[k] = Complex(1.8, 0).mul(Complex({ abs: 1, arg: Math.PI / 6 }));
	const text = ['# MHz S MA R 50', ...maLines(f, g)].join('\n');

	it('loads with a warning at that point, and the band is not split by it', () => {
		const a = analyzeSweep(load(text), claim);
		expect(a.warnings).toEqual([
			{
				code: 'above_unity',
				message: expect.stringMatching(
					/^1 point reads \|S11\| above 1: 1\.8000 at 440 MHz \(80 % over\)\. .*glitch/
				),
				count: 1,
				max_excess: expect.closeTo(0.8, 12),
				frequency_hz: 440e6
			}
		]);
		expectClosedForm(a, F0, 50, 1e5);
		expect(a.claim).toMatchObject({ pass: true, miss_lo_hz: 0, miss_hi_hz: 0 });
		// kept in the display series (3001 points downsampled to 2000) with VSWR off the scale
		expect(a.series.vswr[a.series.f_hz.indexOf(440e6)]).toBeNull();
	});

	it('calibration noise and a glitch in one file: the warning words both', () => {
		const both = g.map((x) => (x.abs() > 0.963 ? x.mul(1.04) : x));
		const noise = both.filter((x, i) => i !== k && x.abs() > 1).length;
		expect(noise).toBeGreaterThan(0);
		const a = analyzeSweep(load(['# MHz S MA R 50', ...maLines(f, both)].join('\n')));
		expect(a.warnings[0].count).toBe(noise + 1);
		expect(a.warnings[0].message).toContain(
			`${noise} of them are within 1 % of 1: calibration noise, as a calibrated instrument reads near total reflection (an open, a short, an antenna far out of its band). 1 is further over: usually a glitch or a sweep taken without calibration.`
		);
	});

	it('most points far above 1 is refused: not a passive one-port, with the likely causes', () => {
		const gain = ['# MHz S DB R 50', ...Array.from(f, (hz) => `${hz / 1e6} 15.2 ${hz / 1e7}`)];
		const r = parseSweep(gain.join('\n'));
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.error).toMatchObject({ code: 'not_passive', line: 2, column: 5 });
		expect(r.error.message).toMatch(
			/^not a passive one-port: \|S11\| is above 1.05 at 3001 of 3001 points/
		);
		expect(r.error.message).toMatch(/The dB values are positive, as in a gain measurement/);
	});

	it('linear magnitudes under DB letters: the refusal names the format that fits', () => {
		const wrong = [
			'# MHz S DB R 50',
			...maLines(
				f,
				g.map((x, i) => (i === k ? Complex(0.5) : x))
			)
		];
		const r = parseSweep(wrong.join('\n'));
		// |Γ| up to 1 read as dB: 10^(|Γ|/20) reaches 1.122 [calc]
		expect(!r.ok && r.error.code).toBe('not_passive');
		expect(!r.ok && r.error.message).toMatch(
			/Read as MA \(linear magnitude and angle\), the same numbers would be a valid reflection: check the format letters on the option line \(line 1 says DB\)/
		);
	});
});

describe('Z-parameter one-port files', () => {
	// series RLC with R = 75 Ω in a file with R 75: Γ = (Z − 75)/(Z + 75), a match at f0
	const f = grid(300e6, 600e6, 3001);
	const z = Array.from(f, (hz) => rlcImpedance(hz, F0, Q, 75));
	const zn = z.map((x) => x.div(75)); // Touchstone 1.x: normalized to R
	const files: Record<string, string> = {
		RI: [
			'# MHz Z RI R 75',
			...Array.from(f, (hz, i) => `${hz / 1e6} ${zn[i].re} ${zn[i].im}`)
		].join('\n'),
		MA: [
			'# MHz Z MA R 75',
			...Array.from(f, (hz, i) => `${hz / 1e6} ${zn[i].abs()} ${zn[i].arg() * DEG}`)
		].join('\n'),
		DB: [
			'# MHz Z DB R 75',
			...Array.from(
				f,
				(hz, i) => `${hz / 1e6} ${20 * Math.log10(zn[i].abs())} ${zn[i].arg() * DEG}`
			)
		].join('\n')
	};

	for (const [format, text] of Object.entries(files)) {
		it(`Touchstone 1.x Z ${format}: Γ = (Z − R)/(Z + R), a conversion note, closed-form metrics`, () => {
			const s = load(text);
			expect(s.z0).toBe(75);
			for (const i of [0, 1350, 3000]) {
				const g = gammaOf(z[i], 75);
				expect(s.re[i]).toBeCloseTo(g.re, 9);
				expect(s.im[i]).toBeCloseTo(g.im, 9);
			}
			const a = analyzeSweep(s, claim);
			expectOnlyNote(
				a,
				'converted_from_z',
				"Z-parameter file: Z11, normalized to R = 75 Ω as Touchstone 1.x writes it, was converted to S11 for the file's reference impedance of 75 Ω: Γ = (Z − R)/(Z + R)."
			);
			expectClosedForm(a, F0, 75, 1e5);
		});
	}

	it('Touchstone 2.0 Z in ohms, then renormalized to a 50 Ω upload: VSWR 1.5 at f0', () => {
		const body = Array.from(f, (hz, i) => `${hz / 1e6} ${z[i].re} ${z[i].im}`);
		const text = [
			'[Version] 2.0',
			'# MHz Z RI R 75',
			'[Number of Ports] 1',
			`[Number of Frequencies] ${f.length}`,
			'[Network Data]',
			...body,
			'[End]'
		].join('\n');
		const a = analyzeSweep(load(text), claim);
		expect(a.warnings[0].message).toMatch(/Z11 in ohms, as Touchstone 2.0 writes it/);
		expectClosedForm(a, F0, 75, 1e5);
		// [calc] R = 75 Ω at 50 Ω: Γ = 25/125 = 0.2, VSWR 1.5 (CHECKS table, Pozar §2.3)
		const s50 = load(text, { z0: 50 });
		const g = gammaOf(z[1350], 50);
		expect(s50.re[1350]).toBeCloseTo(g.re, 9);
		expect(analyzeSweep(s50).min_vswr).toBeCloseTo(1.5, 6);
	});

	it('CSV with R and X columns in ohms (an antenna analyser export) converts for Z0', () => {
		const z50 = Array.from(f, (hz) => rlcImpedance(hz, F0, Q, 50));
		const rows = Array.from(f, (hz, i) => `${hz / 1e6},${z50[i].re},${z50[i].im}`);
		const s = load(['Frequency (MHz),R (ohm),X (ohm)', ...rows].join('\n'));
		expect(s.phase_known).toBe(true);
		const a = analyzeSweep(s, claim);
		expect(a.warnings[0]).toMatchObject({
			code: 'converted_from_z',
			message:
				"CSV impedance: the columns 'R (ohm)' and 'X (ohm)' were read as R and X in ohms and converted to S11 for Z0 = 50 Ω: Γ = (Z − Z0)/(Z + Z0)."
		});
		expectClosedForm(a, F0, 50, 1e5);
		const swr = Array.from(f, (hz, i) => `${hz / 1e6};9.9;${z50[i].re};${z50[i].im}`);
		const b = analyzeSweep(load(['Freq (MHz);SWR;Resistance;Reactance', ...swr].join('\n')));
		expect(b.warnings[0].code).toBe('converted_from_z');
		expect(b.min_vswr).toBeCloseTo(1, 3);
	});
});

describe('loose option lines', () => {
	const f = grid(300e6, 600e6, 3001);
	const g = Array.from(f, (hz) => gammaOf(rlcImpedance(hz, F0, Q, 50), 50));
	const ri = Array.from(f, (hz, i) => `${hz / 1e9} ${g[i].re} ${g[i].im}`);

	it("'# GHz S RI R' (R without its value) reads 50 Ω with a warning naming the line", () => {
		const a = analyzeSweep(
			load(['! exported by a simulator', '# GHz S RI R', ...ri].join('\n')),
			claim
		);
		expect(a.z0).toBe(50);
		expectOnlyNote(
			a,
			'option_r_without_value',
			"Line 2: the option line '# GHz S RI R' gives R without a value; it was read as R 50, the Touchstone default of 50 Ω. Check that the instrument measured against 50 Ω."
		);
		expectClosedForm(a, F0, 50, 1e5);
		const later = analyzeSweep(load(['# GHz R S RI', ...ri].join('\n')));
		expect(later.warnings[0].code).toBe('option_r_without_value');
	});

	it('what is really ambiguous is still refused with line and column', () => {
		const r = parseSweep(['# GHz S RI R fifty', ...ri].join('\n'));
		expect(!r.ok && r.error).toMatchObject({ code: 'bad_option', line: 1, column: 14 });
		const twice = parseSweep(['# GHz S RI MA R 50', ...ri].join('\n'));
		expect(!twice.ok && twice.error).toMatchObject({ code: 'bad_option', line: 1, column: 12 });
	});
});

describe('a comment after every data line', () => {
	const f = grid(300e6, 600e6, 3001);
	const g = Array.from(f, (hz) => gammaOf(rlcImpedance(hz, F0, Q, 50), 50));
	const lines = Array.from(
		f,
		(hz, i) =>
			`${hz / 1e6}\t${20 * Math.log10(g[i].abs())}  ${g[i].arg() * DEG}${i % 2 ? ' ! point ' + i : '!pt'}`
	);

	it('reads every point and keeps at most 200 comments', () => {
		const s = load(['# MHz S DB R 50', ...lines].join('\n'));
		expect(s.f_hz.length).toBe(3001);
		expect(s.comments).toHaveLength(200);
		expect(s.comments[1]).toBe('point 1');
		const a = analyzeSweep(s, claim);
		expect(a.warnings).toEqual([]);
		expectClosedForm(a, F0, 50, 1e5);
	});
});

describe('two-port files', () => {
	// S11: the RLC at 435 MHz with R = 50 Ω; S22: another at 445 MHz with R = Z0 of port 2
	const f = grid(300e6, 600e6, 3001);
	const s11 = Array.from(f, (hz) => gammaOf(rlcImpedance(hz, F0, Q, 50), 50));
	const s22 = (z0: number) => Array.from(f, (hz) => gammaOf(rlcImpedance(hz, 445e6, Q, z0), z0));
	const s21 = Array.from(f, (hz) => Complex({ abs: 0.1, arg: -hz / 1e8 }));
	const ma = (c: Complex) => `${c.abs()} ${c.arg() * DEG}`;
	const ri = (c: Complex) => `${c.re} ${c.im}`;
	const b22 = s22(50);
	const v1 = [
		'! invented 2-port: N11 N21 N12 N22 per line',
		'# MHz S MA R 50',
		...Array.from(
			f,
			(hz, i) => `${hz / 1e6} ${ma(s11[i])} ${ma(s21[i])} ${ma(s21[i])} ${ma(b22[i])}`
		),
		'! noise parameters: frequency, NFmin dB, |Γopt|, angle, Rn/R',
		'300 1.2 0.4 30 0.3',
		'600 1.4 0.5 40 0.3'
	].join('\n');

	it('v1: S11 by default, with a message saying which parameter was used', () => {
		const a = analyzeSweep(load(v1), claim);
		expectOnlyNote(
			a,
			'two_port_parameter',
			'2-port file: S11 was used: the reflection at port 1, referred to 50 Ω, with port 2 terminated in its reference impedance; S21, S12 and S22 were not. Choose S22 in the file options (parameter=s22 in the API) to read port 2 instead. The noise parameters after the network data were skipped.'
		);
		expectClosedForm(a, F0, 50, 1e5);
	});

	it('v1: S22 when asked', () => {
		const s = load(v1, { parameter: 's22' });
		expect(s.ports).toBe(2);
		const a = analyzeSweep(s);
		expect(a.warnings[0].message).toMatch(
			/^2-port file: S22 was used: the reflection at port 2, referred to 50 Ω/
		);
		expectClosedForm(a, 445e6, 50, 1e5);
	});

	it('v2: Upper matrix over two lines a frequency, 21_12 order, per-port [Reference], [Noise Data]', () => {
		const b = s22(75);
		const text = [
			'[Version] 2.0',
			'# MHz S RI R 50',
			'[Number of Ports] 2',
			'[Two-Port Data Order] 21_12',
			`[Number of Frequencies] ${f.length}`,
			'[Reference] 50 75',
			'[Matrix Format] Upper',
			'[Network Data]',
			...Array.from(f, (hz, i) => `${hz / 1e6} ${ri(s11[i])} ${ri(s21[i])}\n  ${ri(b[i])}`),
			'[Noise Data]',
			'300 1.2 0.4 30 0.3',
			'[End]'
		].join('\n');
		const a11 = analyzeSweep(load(text));
		expect(a11.z0).toBe(50);
		expectClosedForm(a11, F0, 50, 1e5);
		const a22 = analyzeSweep(load(text, { parameter: 's22' }));
		expect(a22.z0).toBe(75);
		expect(a22.warnings[0].message).toMatch(
			/S22 was used: the reflection at port 2, referred to 75 Ω/
		);
		expectClosedForm(a22, 445e6, 75, 1e5);
	});

	it('S22 of a 1-port file or a CSV is refused; more than 2 ports and 2-port Z files too', () => {
		const one = parseSweep('# MHz S MA R 50\n1 0.5 0\n', { parameter: 's22' });
		expect(!one.ok && one.error).toMatchObject({ code: 'no_such_parameter', field: 'parameter' });
		expect(!one.ok && one.error.message).toMatch(/this is a 1-port file/);
		const csv = parseSweep('Frequency (MHz),VSWR\n1,2\n', { parameter: 's22' });
		expect(!csv.ok && csv.error.code).toBe('no_such_parameter');
		const z2 = parseSweep('# MHz Z MA R 50\n1 0.5 0 0.1 0 0.1 0 0.5 0\n');
		expect(!z2.ok && z2.error).toMatchObject({ code: 'unsupported_parameter', line: 2 });
		const three = parseSweep('[Version] 2.0\n# MHz S MA R 50\n[Number of Ports] 3\n');
		expect(!three.ok && three.error.message).toMatch(
			/this file has 3 ports: only 1-port and 2-port files are read/
		);
	});
});
