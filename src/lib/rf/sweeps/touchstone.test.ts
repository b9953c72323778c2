import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Sweep, SweepParseError } from './types';
import { decimalNumber, MAX_SWEEP_POINTS, parseTouchstone } from './touchstone';

// Rules cited as "TS 1.1" / "TS 2.0": IBIS Open Forum, Touchstone File Format Specification,
// Rev 1.1 (2002) and Version 2.0 (2009), as summarised in /work/shared/CHECKS.md.

const fixture = (name: string) =>
	readFileSync(new URL(`../../testing/sweeps/${name}`, import.meta.url), 'utf8');

function ok(text: string, z0?: number): Sweep {
	const r = parseTouchstone(text, { z0 });
	if (!r.ok) throw new Error(`expected a sweep, got ${r.error.code}: ${r.error.message}`);
	return r.sweep;
}
function err(text: string): SweepParseError {
	const r = parseTouchstone(text);
	if (r.ok) throw new Error('expected an error');
	return r.error;
}
const deg = (s: Sweep, i: number) => (Math.atan2(s.im[i], s.re[i]) * 180) / Math.PI;
const mag = (s: Sweep, i: number) => Math.hypot(s.re[i], s.im[i]);

describe('Touchstone 1-port, version 1', () => {
	it("TS 1.1 1-port example: '# MHz S MA R 50', '2.000 0.894 -12.136'", () => {
		const s = ok(fixture('spec-example-1port.s1p'));
		expect(s.f_hz[0]).toBe(2e6);
		// [C + calc] CHECKS.md Touchstone: S11 = 0.874020 − j0.187948 at 2 MHz
		expect(s.re[0]).toBeCloseTo(0.87402, 6);
		expect(s.im[0]).toBeCloseTo(-0.187948, 6);
		expect(s.z0).toBe(50);
		expect(s.version).toBe(1);
		expect(s.phase_known).toBe(true);
		expect(s.comments).toContain('freq magS11 angS11');
	});

	it('TS 1.1 option line, format DB: the same point as −0.97 dB', () => {
		const s = ok('# MHz S DB R 50\n2.000 -0.97 -12.136\n');
		// [calc] CHECKS.md: −0.97 dB → |S11| = 10^(−0.97/20) = 0.89433
		expect(mag(s, 0)).toBeCloseTo(0.89433, 5);
		expect(deg(s, 0)).toBeCloseTo(-12.136, 9);
	});

	it('TS 1.1 option line, format RI: real and imaginary parts as given', () => {
		const s = ok('# MHz S RI R 50\n2.000 0.874020 -0.187948\n');
		// [C + calc] the spec example point again: |S11| 0.894, angle −12.136°
		expect(mag(s, 0)).toBeCloseTo(0.894, 5);
		expect(deg(s, 0)).toBeCloseTo(-12.136, 3);
	});

	it("TS 1.1 option line defaults: '#' alone means GHz, S, MA, R 50", () => {
		const s = ok('#\n1.5 0.5 90\n');
		expect(s.f_hz[0]).toBe(1.5e9);
		expect(s.z0).toBe(50);
		// MA: 0.5 at 90° → Γ = j0.5 [calc]
		expect(s.re[0]).toBeCloseTo(0, 12);
		expect(s.im[0]).toBeCloseTo(0.5, 12);
	});

	it('TS 1.1 option line defaults: missing fields keep their defaults one by one', () => {
		const s = ok('# kHz\n100 0.2 0\n');
		expect(s.f_hz[0]).toBe(1e5);
		expect(s.re[0]).toBeCloseTo(0.2, 12); // still MA
		expect(ok('# R 75\n1 0.1 0\n').z0).toBe(75);
	});

	it('TS 1.1 frequency units Hz, kHz, MHz, GHz', () => {
		expect(ok('# Hz S MA R 50\n7 0 0\n').f_hz[0]).toBe(7);
		expect(ok('# KHz S MA R 50\n7 0 0\n').f_hz[0]).toBe(7e3);
		expect(ok('# MHz S MA R 50\n7 0 0\n').f_hz[0]).toBe(7e6);
		expect(ok('# GHz S MA R 50\n7 0 0\n').f_hz[0]).toBe(7e9);
	});

	it('TS 1.1 case-insensitive: lower and mixed case option fields', () => {
		const a = ok('# mhz s db r 50\n2 -6 30\n');
		const b = ok('# MhZ S Db R 50\n2 -6 30\n');
		expect(a.f_hz[0]).toBe(2e6);
		expect(b.re[0]).toBe(a.re[0]);
		expect(b.im[0]).toBe(a.im[0]);
	});

	it('TS 1.1 field order: fields other than # and the value after R in any order', () => {
		const s = ok('# R 75 DB S kHz\n100 -20 0\n');
		expect(s.z0).toBe(75);
		expect(s.f_hz[0]).toBe(1e5);
		expect(mag(s, 0)).toBeCloseTo(0.1, 12); // −20 dB → 0.1 [calc]
	});

	it('TS 1.1 comments: own line, after data, and blank lines', () => {
		const s = ok('! head\n\n# MHz S MA R 50\n  ! indented\n1 0.5 0 ! after data\n\n2 0.4 0\n');
		expect(s.f_hz.length).toBe(2);
		expect(s.comments).toEqual(['head', 'indented', 'after data']);
	});

	it('TS 1.1 only the first option line counts; later ones (before data) are ignored', () => {
		const s = ok('# MHz S MA R 50\n# GHz S RI R 75\n1 0.5 0\n');
		expect(s.f_hz[0]).toBe(1e6);
		expect(s.z0).toBe(50);
	});

	it('TS 1.1 whitespace: tabs and repeated spaces separate numbers', () => {
		const s = ok('# MHz S MA R 50\n1\t0.5   45\n');
		expect(deg(s, 0)).toBeCloseTo(45, 9);
	});

	it('our rule: an option line after data lines is a located error', () => {
		const e = err('# MHz S MA R 50\n1 0.5 0\n  # GHz S MA R 50\n2 0.5 0\n');
		expect(e).toMatchObject({ code: 'option_after_data', line: 3, column: 3 });
		expect(e.message).toMatch(/option line after data/);
	});

	it('refuses Y (not read) and H, G (2-port only) parameters at the letter', () => {
		expect(err('# MHz Y RI R 50\n1 0.5 0\n')).toMatchObject({
			code: 'unsupported_parameter',
			line: 1,
			column: 7
		});
		expect(err('# MHz Y RI R 50\n1 0.5 0\n').message).toMatch(/S-parameters/);
		expect(err('# MHz H MA R 50\n1 0.5 0\n').message).toMatch(/2-port/);
		expect(err('# MHz G MA R 50\n1 0.5 0\n').code).toBe('unsupported_parameter');
	});

	it('refuses unknown option fields, a bad R value and a field given twice', () => {
		expect(err('# MHz S XY R 50\n1 0 0\n')).toMatchObject({ code: 'bad_option', column: 9 });
		expect(err('# MHz S MA R -5\n1 0 0\n')).toMatchObject({ code: 'bad_option', column: 14 });
		expect(err('# MHz S MA R abc\n1 0 0\n')).toMatchObject({ code: 'bad_option', column: 14 });
		expect(err('# MHz S MA R 0\n1 0 0\n').message).toMatch(/positive reference impedance/);
		expect(err('# MHz GHz S MA\n1 0 0\n').message).toMatch(/twice/);
		expect(err('# MHz S MA R 50 R 75\n1 0 0\n').message).toMatch(
			/reference impedance is given twice/
		);
		expect(err('# MHz S MA DB\n1 0 0\n')).toMatchObject({ code: 'bad_option', column: 12 });
	});

	it('a line of 7 numbers (3-port) or a continuation line of 8 (4 ports and more) is refused', () => {
		expect(err('# GHz S MA R 50\n1 0.5 0 0.1 0 0.1 0\n')).toMatchObject({
			code: 'too_many_ports',
			line: 2,
			column: 1
		});
		const four = '# GHz S MA R 50\n1 0.5 0 0.1 0 0.1 0 0.1 0\n 0.1 0 0.5 0 0.1 0 0.1 0\n';
		const e = err(four);
		expect(e).toMatchObject({ code: 'too_many_ports', line: 3, column: 2 });
		expect(e.message).toMatch(/4 or more ports/);
	});

	it('data lines with the wrong count of numbers are located', () => {
		expect(err('# MHz S MA R 50\n1 0.5\n')).toMatchObject({
			code: 'field_count',
			line: 2,
			column: 1
		});
		expect(err('# MHz S MA R 50\n1 0.5 0 7\n').message).toMatch(/found 4/);
	});

	it('most points above |S11| = 1.05 is refused as not passive, located at the first such point', () => {
		const e = err('# MHz S MA R 50\n1 0.5 0\n2 1.2 10\n3 1.3 20\n');
		expect(e).toMatchObject({ code: 'not_passive', line: 3, column: 3 });
		expect(e.message).toMatch(/not a passive one-port/);
		expect(e.message).toMatch(/at 2 of 3 points \(largest 1\.300\)/);
		expect(e.message).toMatch(/gain measurement/);
		// one such point of three loads (see sweep-quirks.test.ts for the warning)
		expect(ok('# MHz S MA R 50\n1 0.5 0\n2 1.2 10\n3 0.5 20\n').re[1]).toBeCloseTo(
			1.2 * Math.cos(Math.PI / 18),
			12
		);
	});

	it('|Γ| > 1.05 from DB and RI is refused too; |Γ| = 1 is accepted', () => {
		// [calc] 0.5 dB → |S11| = 10^(0.5/20) = 1.0593
		expect(err('# MHz S DB R 50\n1 0.5 0\n').code).toBe('not_passive');
		expect(err('# MHz S RI R 50\n1 0.8 0.7\n').code).toBe('not_passive');
		expect(ok('# MHz S RI R 50\n1 0.6 0.8\n').re[0]).toBe(0.6); // 0.6² + 0.8² = 1 [calc]
		expect(err('# MHz S MA R 50\n1 -0.2 0\n').code).toBe('bad_value');
		// 10^(1e300/20) overflows to Infinity: refused at that line, never stored as NaN
		expect(err('# MHz S DB R 50\n1 -3 0\n2 1e300 90\n3 -3 0\n')).toMatchObject({
			code: 'not_passive',
			line: 3,
			column: 3
		});
	});

	it('TS 1.1 frequencies increase: decreasing and duplicate frequencies are located', () => {
		expect(err('# MHz S MA R 50\n1 0 0\n3 0 0\n2 0 0\n')).toMatchObject({
			code: 'not_increasing',
			line: 4,
			column: 1
		});
		expect(err('# MHz S MA R 50\n1 0 0\n  1.0 0 0\n')).toMatchObject({
			code: 'duplicate_frequency',
			line: 3,
			column: 3
		});
		expect(err('# MHz S MA R 50\n-1 0 0\n').code).toBe('bad_value');
		expect(err('# GHz S MA R 50\n1e300 0 0\n').code).toBe('bad_value');
	});

	it('non-numbers are located by line and column', () => {
		expect(err('# MHz S MA R 50\n1 0.5 0\n2.000 0.8x4 -12\n')).toMatchObject({
			code: 'not_a_number',
			line: 3,
			column: 7
		});
		expect(err('# MHz S MA R 50\n1 0.5 abc\n')).toMatchObject({ line: 2, column: 7 });
		expect(err('# MHz S MA R 50\nInfinity 0.5 0\n').code).toBe('not_a_number');
		expect(err('# MHz S MA R 50\n0x10 0.5 0\n').code).toBe('not_a_number');
	});

	it('decimalNumber takes plain decimals and exponents only', () => {
		expect([decimalNumber('1e9'), decimalNumber('-.5'), decimalNumber('+2.')]).toEqual([
			1e9, -0.5, 2
		]);
		for (const s of ['', ' ', '0x1f', '0b1', '0o7', 'NaN', 'Infinity', '1e400', '1,5']) {
			expect(decimalNumber(s)).toBeNaN();
		}
	});

	it('a file with no data lines is refused', () => {
		expect(err('! only a comment\n# MHz S MA R 50\n').code).toBe('no_data');
	});

	it('200 000 points parse; 200 001 are refused at the 200 001st line', () => {
		const lines = ['# Hz S MA R 50'];
		for (let i = 1; i <= MAX_SWEEP_POINTS; i++) lines.push(`${i} 0.5 0`);
		expect(ok(lines.join('\n')).f_hz.length).toBe(200_000);
		lines.push('200001 0.5 0');
		expect(err(lines.join('\n'))).toMatchObject({ code: 'too_many_points', line: 200_002 });
	});

	it('renormalizes to a requested z0 when it differs from R', () => {
		// Z = 100 Ω: Γ = (100−50)/(100+50) = 1/3 at 50 Ω, 0 at 100 Ω [calc, Pozar 4th ed. §2.3]
		const s = ok('# MHz S RI R 50\n1 0.3333333333333333 0\n', 100);
		expect(s.z0).toBe(100);
		expect(Math.hypot(s.re[0], s.im[0])).toBeLessThan(1e-12);
	});
});

describe('Touchstone 1-port, version 2 keywords', () => {
	it('TS 2.0 [Version], [Number of Ports], [Number of Frequencies], [Reference], [Network Data], [End]', () => {
		const s = ok(fixture('v2-1port.s1p'));
		expect(s.version).toBe(2);
		expect(s.z0).toBe(75); // [Reference] overrides R of the option line
		expect(Array.from(s.f_hz)).toEqual([430e6, 435e6, 440e6]);
		expect(s.re[1]).toBe(0.05);
		expect(s.comments).toContain('near resonance');
	});

	const v2 = (body: string) => `[Version] 2.0\n# MHz S MA R 50\n${body}`;

	it('TS 2.0 [Reference] may stand on the next line', () => {
		const s = ok(
			v2(
				'[Number of Ports] 1\n[Number of Frequencies] 1\n[Reference]\n60\n[Network Data]\n1 0.5 0\n[End]\n'
			)
		);
		expect(s.z0).toBe(60);
	});

	it('TS 2.0 [End] is required', () => {
		const e = err(v2('[Number of Ports] 1\n[Number of Frequencies] 1\n[Network Data]\n1 0.5 0\n'));
		expect(e.code).toBe('missing_keyword');
		expect(e.message).toMatch(/\[End\]/);
	});

	it('TS 2.0 [Number of Frequencies] is checked against the data', () => {
		const e = err(
			v2(
				'[Number of Ports] 1\n[Number of Frequencies] 3\n[Network Data]\n1 0.5 0\n2 0.5 0\n[End]\n'
			)
		);
		expect(e).toMatchObject({ code: 'count_mismatch', line: 4 });
	});

	it('TS 2.0 [Number of Ports] above 2 is refused at the keyword', () => {
		const e = err(
			v2('[Number of Ports] 4\n[Number of Frequencies] 1\n[Network Data]\n1 0.5 0\n[End]\n')
		);
		expect(e).toMatchObject({ code: 'too_many_ports', line: 3, column: 19 });
		expect(e.message).toMatch(/this file has 4 ports: only 1-port and 2-port files are read/);
	});

	it('TS 2.0 a frequency may continue on the next line; a short or long one is located', () => {
		const head = '[Number of Ports] 1\n[Number of Frequencies] 2\n[Network Data]\n';
		const s = ok(v2(`${head}1 0.5\n 90\n2 0.4 0\n[End]\n`));
		expect(s.im[0]).toBeCloseTo(0.5, 12); // MA 0.5 at 90° [calc]
		expect(err(v2(`${head}1 0.5\n[End]\n`))).toMatchObject({ code: 'field_count', line: 6 });
		expect(err(v2(`${head}1 0.5 0 7\n2 0.4 0\n[End]\n`)).message).toMatch(/found 4/);
	});

	it('TS 2.0 [Reference] takes one value per port', () => {
		const head = '[Number of Ports] 1\n[Reference] 50 75\n';
		expect(
			err(v2(`${head}[Number of Frequencies] 1\n[Network Data]\n1 0.5 0\n[End]\n`))
		).toMatchObject({
			code: 'bad_keyword',
			line: 4
		});
		expect(err(v2('[Number of Ports] 1\n[Reference] x\n')).message).toMatch(
			/one positive impedance per port/
		);
	});

	it('TS 2.0 [Number of Ports] and [Number of Frequencies] come before [Network Data]', () => {
		expect(err(v2('[Number of Frequencies] 1\n[Network Data]\n1 0.5 0\n[End]\n')).code).toBe(
			'missing_keyword'
		);
		expect(err(v2('[Number of Ports] 1\n[Network Data]\n1 0.5 0\n[End]\n')).code).toBe(
			'missing_keyword'
		);
		expect(
			err(v2('[Number of Ports] 1\n[Number of Frequencies] 1\n1 0.5 0\n[End]\n')).message
		).toMatch(/before \[Network Data\]/);
	});

	it('TS 2.0 [Version] must come first; keywords need a version 2 file', () => {
		expect(err('# MHz S MA R 50\n[Version] 2.0\n').message).toMatch(/first line/);
		expect(err('# MHz S MA R 50\n[Number of Ports] 1\n1 0.5 0\n').code).toBe('bad_keyword');
		expect(err('[Version] 3.0\n').code).toBe('bad_keyword');
	});

	it('TS 2.0 keywords are case-insensitive; unknown keywords are located', () => {
		const s = ok(
			'[version] 2.0\n# mhz s ma r 50\n[NUMBER OF PORTS] 1\n[number of frequencies] 1\n[network data]\n1 0.5 0\n[end]\n'
		);
		expect(s.version).toBe(2);
		expect(err(v2('[Bogus Keyword] 1\n'))).toMatchObject({ code: 'bad_keyword', line: 3 });
	});
});
