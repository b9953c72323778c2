import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseCsvSweep } from './csv';
import type { ParseSweepOptions, Sweep, SweepParseError } from './types';

const fixture = (name: string) =>
	readFileSync(new URL(`../../testing/sweeps/${name}`, import.meta.url), 'utf8');

function ok(text: string, opts: ParseSweepOptions = {}): Sweep {
	const r = parseCsvSweep(text, opts);
	if (!r.ok) throw new Error(`expected a sweep, got ${r.error.code}: ${r.error.message}`);
	return r.sweep;
}
function err(text: string, opts: ParseSweepOptions = {}): SweepParseError {
	const r = parseCsvSweep(text, opts);
	if (r.ok) throw new Error('expected an error');
	return r.error;
}
const mags = (s: Sweep) => Array.from(s.re, (re, i) => Math.hypot(re, s.im[i]));

// Check values: CHECKS.md "Reflection, VSWR, return loss" table (Pozar 4th ed. §2.3 relations):
// VSWR 1.5 ↔ |Γ| 0.2000 ↔ RL 13.979 dB; VSWR 2 ↔ 0.3333 ↔ 9.542 dB; VSWR 3 ↔ 0.5000 ↔ 6.021 dB.

describe('CSV sweeps: quantities named in the header', () => {
	it('VSWR column with "Frequency (MHz)" header: magnitude only, phase unknown', () => {
		const s = ok('Frequency (MHz),VSWR\n2400,3\n2450,1.5\n2500,2\n');
		expect(Array.from(s.f_hz)).toEqual([2.4e9, 2.45e9, 2.5e9]);
		const m = mags(s);
		expect(m[0]).toBeCloseTo(0.5, 4);
		expect(m[1]).toBeCloseTo(0.2, 4);
		expect(m[2]).toBeCloseTo(0.3333, 4);
		expect(s.phase_known).toBe(false);
		expect(Array.from(s.im)).toEqual([0, 0, 0]);
		expect(s.source).toBe('csv');
	});

	it('semicolons with decimal commas parse (return loss, positive dB)', () => {
		const s = ok(fixture('semicolon-decimal-comma.csv'));
		expect(Array.from(s.f_hz)).toEqual([2.4e9, 2.4505e9, 2.5e9]);
		const m = mags(s);
		expect(m[0]).toBeCloseTo(0.5, 4);
		expect(m[1]).toBeCloseTo(0.2, 4);
		expect(m[2]).toBeCloseTo(0.3333, 4);
		expect(s.comments).toContain('synthetic demo data for tests');
	});

	it('tab delimiter, "f [GHz]" and "S11 (dB)" (negative)', () => {
		const s = ok('f [GHz]\tS11 (dB)\n2,40\t-13,979\n2.45\t-9.542\n');
		expect(s.f_hz[0]).toBeCloseTo(2.4e9, 0);
		expect(mags(s)[0]).toBeCloseTo(0.2, 4);
		expect(mags(s)[1]).toBeCloseTo(0.3333, 4);
	});

	it('"freq_hz" with |S11| as a linear magnitude', () => {
		const s = ok('freq_hz,|S11|\n1000000,0.2\n2000000,0.5\n');
		expect(Array.from(s.f_hz)).toEqual([1e6, 2e6]);
		expect(mags(s)).toEqual([0.2, 0.5]);
	});

	it('S11 magnitude and angle give the complex Γ (TS 1.1 1-port example point)', () => {
		const s = ok('Frequency (MHz),S11 Mag,S11 Phase (deg)\n2.000,0.894,-12.136\n');
		// [C + calc] CHECKS.md Touchstone example: S11 = 0.874020 − j0.187948
		expect(s.re[0]).toBeCloseTo(0.87402, 6);
		expect(s.im[0]).toBeCloseTo(-0.187948, 6);
		expect(s.phase_known).toBe(true);
	});

	it('S11 in dB with a phase column, and real/imaginary columns', () => {
		const db = ok('Frequency (MHz);S11 dB;S11 angle\n2,000;-0,97;-12,136\n');
		expect(Math.hypot(db.re[0], db.im[0])).toBeCloseTo(0.89433, 5); // [calc] CHECKS.md
		const ri = ok('"Frequency (MHz)","Re(S11)","Im(S11)"\n2,0.874020,-0.187948\n');
		expect(ri.re[0]).toBe(0.87402);
		expect(ri.im[0]).toBe(-0.187948);
		expect(ri.phase_known).toBe(true);
	});

	it('comment lines, blank lines and CRLF line ends are skipped', () => {
		const s = ok('# exported sweep\r\nFrequency (kHz),SWR\r\n\r\n100,1.5\r\n# mid\r\n200,2\r\n');
		expect(Array.from(s.f_hz)).toEqual([1e5, 2e5]);
	});
});

describe('CSV sweeps: ambiguous columns ask a question', () => {
	it('a "dB" header could be return loss or S11: code ambiguous, choices, and resolution', () => {
		const text = 'Frequency (MHz);dB\n2400;9,542\n2450;13,979\n';
		const e = err(text);
		expect(e).toMatchObject({ code: 'ambiguous', field: 'quantity', choices: ['rl_db', 's11_db'] });
		expect(e.message).toMatch(/Which quantity/);
		expect(e.message).toMatch(/return loss/);
		const s = ok(text, { quantity: 'rl_db' });
		expect(mags(s)[0]).toBeCloseTo(0.3333, 4);
	});

	it('a single unnamed value column: asks which quantity, then reads it', () => {
		const text = 'Frequency (MHz),\n2400,2\n2450,1.5\n';
		const e = err(text);
		expect(e.code).toBe('ambiguous');
		expect(e.choices).toEqual(['vswr', 'rl_db', 's11_db', 's11_mag']);
		expect(mags(ok(text, { quantity: 'vswr' }))[1]).toBeCloseTo(0.2, 4);
	});

	it('no header at all: asks for the frequency unit, then the quantity', () => {
		const text = '2400;2\n2450;1,5\n';
		expect(err(text)).toMatchObject({ code: 'ambiguous', field: 'freq_unit' });
		expect(err(text, { freq_unit: 'MHz' })).toMatchObject({ code: 'ambiguous', field: 'quantity' });
		const s = ok(text, { freq_unit: 'MHz', quantity: 'vswr' });
		expect(s.f_hz[1]).toBe(2.45e9);
	});

	it('a frequency header without a unit asks for freq_unit', () => {
		const e = err('Frequency,VSWR\n2400,2\n');
		expect(e).toMatchObject({
			code: 'ambiguous',
			field: 'freq_unit',
			choices: ['Hz', 'kHz', 'MHz', 'GHz']
		});
		expect(ok('Frequency,VSWR\n2400,2\n', { freq_unit: 'MHz' }).f_hz[0]).toBe(2.4e9);
	});

	it('several unnamed columns: asks for the column; column by name or 1-based index resolves', () => {
		const text = 'Frequency (MHz),trace A,trace B\n2400,2,3\n';
		expect(err(text, { quantity: 'vswr' })).toMatchObject({ code: 'ambiguous', field: 'column' });
		expect(mags(ok(text, { quantity: 'vswr', column: 'trace b' }))[0]).toBeCloseTo(0.5, 4);
		expect(mags(ok(text, { quantity: 'vswr', column: 2 }))[0]).toBeCloseTo(0.3333, 4);
		expect(err(text, { column: 'nope', quantity: 'vswr' }).choices).toEqual(['trace A', 'trace B']);
	});

	it('no frequency column is a question too', () => {
		expect(err('x;y\n1;2\n')).toMatchObject({ code: 'ambiguous', field: 'column' });
	});
});

describe('CSV sweeps: bad input is located', () => {
	it('non-number at line and column', () => {
		expect(err('Frequency (MHz);VSWR\n2400;1,5\n2450;abc\n')).toMatchObject({
			code: 'not_a_number',
			line: 3,
			column: 6
		});
		expect(err('Frequency (MHz),VSWR\n2400,\n').message).toMatch(/empty/);
	});

	it('decreasing and duplicate frequencies', () => {
		expect(err('Frequency (MHz),VSWR\n2400,2\n2300,2\n')).toMatchObject({
			code: 'not_increasing',
			line: 3,
			column: 1
		});
		expect(err('Frequency (MHz),VSWR\n2400,2\n2400,2\n')).toMatchObject({
			code: 'duplicate_frequency',
			line: 3
		});
	});

	it('impedance columns: R = −Z0 with X = 0 is located; negative R at most points is refused', () => {
		// [calc] Γ = (Z − Z0)/(Z + Z0) is infinite at Z = −Z0 (Pozar 4th ed. §2.3)
		expect(err('Frequency (MHz),R,X\n1,50,0\n2,-50,0\n3,50,0\n')).toMatchObject({
			code: 'not_passive',
			line: 3,
			column: 3
		});
		// R = −25 Ω: Γ = −75/25 = −3 [calc]
		const e = err('Frequency (MHz),Resistance (ohm),Reactance (ohm)\n1,-25,0\n2,-25,0\n3,50,0\n');
		expect(e).toMatchObject({ code: 'not_passive', line: 2 });
		expect(e.message).toMatch(/resistance is negative at most points/);
		// Re(Z), Im(Z) name impedance too; Re(S11), Im(S11) do not
		const z = ok('Frequency (MHz),Re(Z),Im(Z)\n1,150,0\n');
		expect(z.re[0]).toBeCloseTo(0.5, 12); // [calc] (150 − 50)/(150 + 50)
	});

	it('VSWR below 1, negative return loss and positive S11 dB are refused with a hint', () => {
		expect(err('Frequency (MHz),VSWR\n2400,0.9\n')).toMatchObject({
			code: 'bad_value',
			line: 2,
			column: 6
		});
		const rl = err('Frequency (MHz),Return Loss (dB)\n2400,-10\n');
		expect(rl.code).toBe('not_passive');
		expect(rl.message).toMatch(/s11_db/);
		expect(err('Frequency (MHz),S11 (dB)\n2400,3\n').message).toMatch(/rl_db/);
		expect(err('Frequency (MHz),S11 Mag,S11 Phase\n2400,1.5,0\n').code).toBe('not_passive');
	});

	it('short rows and a missing delimiter', () => {
		expect(err('Frequency (MHz),S11 Mag,S11 Phase\n2400,0.5\n')).toMatchObject({
			code: 'field_count',
			line: 2
		});
		expect(err('Frequency\n2400\n').code).toBe('bad_header');
	});

	it('200 001 rows are refused', () => {
		const rows = ['freq_hz,VSWR'];
		for (let i = 1; i <= 200_001; i++) rows.push(`${i},1.5`);
		expect(err(rows.join('\n'))).toMatchObject({ code: 'too_many_points', line: 200_002 });
	});
});
