import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseAnalyzeQuery, parseSweep, sniffFormat } from './sweep';
import { analyzeSweep } from './claim-check';
import { seededRandom, syntheticResonatorSweep, toTouchstone } from './synthetic';

const fixture = (name: string) =>
	readFileSync(new URL(`../../testing/sweeps/${name}`, import.meta.url), 'utf8');

describe('parseSweep', () => {
	it('reads Touchstone and CSV through format auto', () => {
		const ts = parseSweep(fixture('spec-example-1port.s1p'));
		expect(ts.ok && ts.sweep.source).toBe('touchstone');
		const csv = parseSweep(fixture('semicolon-decimal-comma.csv'));
		expect(csv.ok && csv.sweep.source).toBe('csv');
		expect(sniffFormat('1 0.5 0 ! data without an option line\n')).toBe('touchstone');
		expect(sniffFormat('Frequency (MHz)\tVSWR\n')).toBe('csv');
		expect(sniffFormat('#MHz S MA R 50\n1 0.5 0\n')).toBe('touchstone');
		// a garbled option line still reaches the Touchstone reader, which says what is wrong
		const garbled = parseSweep('# MHz S QQ R 50\n1 0.5 0\n');
		expect(!garbled.ok && garbled.error).toMatchObject({ code: 'bad_option', line: 1, column: 9 });
	});

	it('an explicit format wins over sniffing', () => {
		const r = parseSweep('Frequency (MHz),VSWR\n1,2\n', { format: 'touchstone' });
		expect(r.ok).toBe(false);
		expect(!r.ok && r.error.code).toBe('field_count');
	});

	it('empty and blank files get a clear message', () => {
		for (const text of ['', '  \n\n\t\n', '\ufeff']) {
			const r = parseSweep(text);
			expect(!r.ok && r.error).toMatchObject({ code: 'empty', message: 'the file is empty' });
		}
	});

	it('binary junk (NUL bytes, undecodable bytes) is refused with its position', () => {
		const nul = parseSweep('# MHz S MA R 50\n1 0.5\u0000 0\n');
		expect(!nul.ok && nul.error).toMatchObject({ code: 'binary', line: 2, column: 6 });
		expect(!nul.ok && nul.error.message).toMatch(/not a text file/);
		const bytes = new Uint8Array(512);
		const rand = seededRandom(11);
		for (let i = 0; i < bytes.length; i++) bytes[i] = Math.floor(rand() * 256);
		const junk = parseSweep(new TextDecoder().decode(bytes));
		expect(!junk.ok && junk.error.code).toBe('binary');
	});

	it('refuses bad options without parsing', () => {
		const bad = parseSweep('1 0 0', { z0: -5 });
		expect(!bad.ok && bad.error).toMatchObject({ code: 'bad_argument', field: 'z0' });
		// a caller in plain JS may pass anything
		const fmt = parseSweep('1 0 0', { format: 'xml' as 'csv' });
		expect(!fmt.ok && fmt.error.field).toBe('format');
		expect(parseSweep(42 as unknown as string).ok).toBe(false);
	});

	it('fuzz: random mutations of a valid file always return a result, never throw', () => {
		const s = syntheticResonatorSweep({
			f0_hz: 5.8e9,
			q: 15,
			f_start_hz: 5.5e9,
			f_stop_hz: 6.1e9,
			points: 40
		});
		const valid = [
			toTouchstone(s, { unit: 'GHz', format: 'MA', comments: ['synthetic demo data'] }),
			'[Version] 2.0\n# MHz S RI R 50\n[Number of Ports] 1\n[Number of Frequencies] 2\n[Network Data]\n1 0.1 0\n2 0.2 0\n[End]\n',
			'Frequency (MHz);S11 Mag;S11 Phase (deg)\n1;0,5;10\n2;0,4;20\n'
		];
		const alphabet = '0123456789.-+eE #![]!,;\t\n\r\u0000xyzMHzGHzSDBMARI"|';
		const rand = seededRandom(2024);
		const pick = (n: number) => Math.floor(rand() * n);
		let results = 0;
		for (let k = 0; k < 1500; k++) {
			let t = valid[k % valid.length];
			for (let m = 1 + pick(4); m > 0; m--) {
				const at = pick(t.length + 1);
				const op = pick(4);
				const ch = alphabet[pick(alphabet.length)];
				if (op === 0) t = t.slice(0, at) + ch + t.slice(at);
				else if (op === 1) t = t.slice(0, at) + t.slice(at + 1 + pick(8));
				else if (op === 2) t = t.slice(0, at) + ch + t.slice(at + 1);
				else t = t.slice(0, at) + t.slice(pick(t.length));
			}
			const format = (['auto', 'touchstone', 'csv'] as const)[pick(3)];
			const r = parseSweep(t, { format });
			if (!r.ok) {
				expect(typeof r.error.message).toBe('string');
				expect(r.error.message.length).toBeGreaterThan(0);
				if (r.error.line !== undefined) expect(r.error.line).toBeGreaterThanOrEqual(1);
			} else {
				const { f_hz, re, im } = r.sweep;
				const finite = [...f_hz, ...re, ...im].every(Number.isFinite);
				expect(finite).toBe(true);
				expect(() => JSON.stringify(analyzeSweep(r.sweep, { design_hz: 5.8e9 }))).not.toThrow();
			}
			results++;
		}
		expect(results).toBe(1500);
	});
});

describe('analyzeSweep result shape', () => {
	const s = syntheticResonatorSweep({
		f0_hz: 2.45e9,
		q: 30,
		r_ohm: 60,
		f_start_hz: 2.3e9,
		f_stop_hz: 2.6e9,
		points: 50_001,
		noise: 0.001,
		seed: 4
	});

	it('has exactly the agreed keys, is JSON-ready, and downsamples to ≤ 2000 points keeping the minimum', () => {
		const r = analyzeSweep(s, {
			design_hz: 2.45e9,
			band_lo_hz: 2.43e9,
			band_hi_hz: 2.47e9,
			vswr_max: 2
		});
		expect(Object.keys(r).sort()).toEqual(
			[
				'points',
				'f_start_hz',
				'f_stop_hz',
				'z0',
				'min_vswr',
				'f_min_vswr_hz',
				'bands_vswr_2',
				'bands_vswr_1_5',
				'fractional_bandwidth',
				'vswr_at_design',
				'rl_at_design_db',
				'claim',
				'phase_known',
				'warnings',
				'series'
			].sort()
		);
		expect(r.warnings).toEqual([]);
		expect(Object.keys(r.claim!).sort()).toEqual([
			'miss_hi_hz',
			'miss_lo_hz',
			'pass',
			'worst_vswr_in_band'
		]);
		expect(Object.keys(r.series).sort()).toEqual(['f_hz', 'im', 're', 'rl_db', 'vswr']);
		expect(JSON.parse(JSON.stringify(r))).toEqual(r);
		expect(r.points).toBe(50_001);
		expect(r.series.f_hz.length).toBeLessThanOrEqual(2000);
		let k = 0;
		for (let i = 1; i < s.f_hz.length; i++) {
			if (Math.hypot(s.re[i], s.im[i]) < Math.hypot(s.re[k], s.im[k])) k = i;
		}
		expect(r.series.f_hz).toContain(s.f_hz[k]);
		const vs = r.series.vswr as number[];
		expect(Math.min(...vs)).toBe(vs[r.series.f_hz.indexOf(s.f_hz[k])]);
	});

	it('return loss at the design frequency follows the interpolated VSWR there', () => {
		const r = analyzeSweep(s, { design_hz: 2.4e9 });
		const g = (r.vswr_at_design! - 1) / (r.vswr_at_design! + 1);
		expect(r.rl_at_design_db).toBeCloseTo(-20 * Math.log10(g), 10);
		expect(analyzeSweep(s, { design_hz: 3e9 }).vswr_at_design).toBeNull();
	});

	it('phase_known is false for magnitude-only data, and total reflection becomes null', () => {
		const p = parseSweep('Frequency (MHz),S11 Mag\n1,1\n2,0.2\n3,1\n');
		if (!p.ok) throw new Error(p.error.message);
		const r = analyzeSweep(p.sweep);
		expect(r.phase_known).toBe(false);
		expect(r.series.vswr).toEqual([null, expect.closeTo(1.5, 10), null]);
		expect(r.bands_vswr_2).toEqual([[2e6, 2e6]]);
	});
});

describe('parseAnalyzeQuery', () => {
	const q = (s: string) => parseAnalyzeQuery(new URLSearchParams(s));

	it('accepts a full, valid query', () => {
		expect(
			q(
				'format=csv&z0=75&design_hz=2.45e9&band_lo_hz=2.4e9&band_hi_hz=2.5e9&vswr_max=2&quantity=rl_db&column=dB&freq_unit=mhz&parameter=S22'
			)
		).toEqual({
			ok: true,
			value: {
				format: 'csv',
				z0: 75,
				design_hz: 2.45e9,
				band_lo_hz: 2.4e9,
				band_hi_hz: 2.5e9,
				vswr_max: 2,
				column: 'dB',
				quantity: 'rl_db',
				freq_unit: 'MHz',
				parameter: 's22'
			}
		});
		expect(q('')).toEqual({ ok: true, value: { format: 'auto' } });
	});

	it('names the field of every bad value', () => {
		const cases: [string, string][] = [
			['format=xml', 'format'],
			['z0=0', 'z0'],
			['z0=10001', 'z0'],
			['z0=abc', 'z0'],
			['design_hz=-1', 'design_hz'],
			['design_hz=0x10', 'design_hz'],
			['design_hz=Infinity', 'design_hz'],
			['band_lo_hz=2.5e9&band_hi_hz=2.4e9', 'band_hi_hz'],
			['band_lo_hz=2.4e9', 'band_hi_hz'],
			['band_lo_hz=1&band_hi_hz=2&vswr_max=1', 'vswr_max'],
			['vswr_max=2', 'vswr_max'],
			['quantity=power', 'quantity'],
			['freq_unit=THz', 'freq_unit'],
			['z0=50&z0=75', 'z0'],
			['parameter=s21', 'parameter'],
			['parameter=', 'parameter']
		];
		for (const [query, field] of cases) {
			const r = q(query);
			expect(r.ok, query).toBe(false);
			if (!r.ok) {
				expect(r.error.field, query).toBe(field);
				expect(r.error.message.length).toBeGreaterThan(0);
			}
		}
	});
});
