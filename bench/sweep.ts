import { pathToFileURL } from 'node:url';
import { parseSweep } from '../src/lib/rf/sweeps/sweep';
import { analyzeSweep } from '../src/lib/rf/sweeps/claim-check';
import { syntheticResonatorSweep, toTouchstone } from '../src/lib/rf/sweeps/synthetic';

const RUNS = 9;
const TARGET_MS = 150;

function median(xs: number[]): number {
	const s = [...xs].sort((a, b) => a - b);
	return s[s.length >> 1];
}

/** Parse + analyze of a 100 000-point Touchstone file (synthetic demo data); target ≤ 150 ms median. */
export async function benchSweep(): Promise<Record<string, number>> {
	const sweep = syntheticResonatorSweep({
		f0_hz: 2.45e9,
		q: 25,
		r_ohm: 55,
		f_start_hz: 2.2e9,
		f_stop_hz: 2.7e9,
		points: 100_000,
		noise: 0.002,
		seed: 42
	});
	const text = toTouchstone(sweep, {
		unit: 'GHz',
		format: 'DB',
		comments: ['synthetic demo data: benchmark sweep']
	});
	const parse: number[] = [];
	const total: number[] = [];
	for (let i = 0; i < RUNS + 2; i++) {
		const t0 = performance.now();
		const r = parseSweep(text, { format: 'auto' });
		const t1 = performance.now();
		if (!r.ok) throw new Error(`benchmark file did not parse: ${r.error.message}`);
		analyzeSweep(r.sweep, { design_hz: 2.45e9, band_lo_hz: 2.4e9, band_hi_hz: 2.5e9 });
		const t2 = performance.now();
		if (i >= 2) {
			parse.push(t1 - t0);
			total.push(t2 - t0);
		}
	}
	return {
		points: sweep.f_hz.length,
		file_bytes: text.length,
		parse_median_ms: median(parse),
		parse_analyze_median_ms: median(total),
		parse_analyze_min_ms: Math.min(...total),
		target_ms: TARGET_MS
	};
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
	const r = await benchSweep();
	for (const [k, v] of Object.entries(r))
		console.log(`${k.padEnd(26)} ${Number.isInteger(v) ? v : v.toFixed(1)}`);
	console.log(r.parse_analyze_median_ms <= TARGET_MS ? 'within target' : 'OVER TARGET');
}
