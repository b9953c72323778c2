/**
 * Dimension engine benchmark: a 40-row table (an invented 2.4 GHz biquad with a patch and a
 * waveguide feed; demo data, not a real design), evaluated at 1000 frequencies after one compile.
 * Run: npx tsx bench/engine.ts
 */
import { compileTable, evaluateTable, type TableDefinition } from '../src/lib/rf/tables/table';

export const BENCH_TABLE: TableDefinition = {
	parameters: [
		{ key: 'vf', value: 0.66 },
		{ key: 'er', value: 2.2 },
		{ key: 'h', value: '1.6 mm' },
		{ key: 'wire_d', value: '2 mm', valid_ratio: { of: 'lambda', min: 0.005, max: 0.03 } },
		{ key: 'pitch', value: '14 deg' },
		{ key: 'tube_id', value: '84 mm' }
	],
	rows: [
		{ key: 'quarter', formula: 'lambda / 4', kind: 'resonant' },
		{ key: 'side', formula: 'lambda / 4 + wire_d / 2', kind: 'resonant' },
		{ key: 'side_in', formula: '(side - wire_d) to mm', kind: 'resonant' },
		{ key: 'gap', formula: '2 mm', kind: 'structural' },
		{ key: 'wire', formula: 'wire_d', kind: 'material', catalogue: 'awg' },
		{ key: 'loop', formula: '4 * side', kind: 'structural' },
		{ key: 'refl_w', formula: '0.89 * lambda', kind: 'structural' },
		{ key: 'refl_h', formula: '0.45 * lambda', kind: 'structural' },
		{ key: 'spacing', formula: 'lambda / 8 + 1.5 mm', kind: 'resonant' },
		{ key: 'standoff', formula: 'spacing - h', kind: 'material', catalogue: 'standoff' },
		{ key: 'lip', formula: 'max(lambda / 10, 10 mm)', kind: 'structural' },
		{ key: 'balun', formula: 'lambda_in(f, vf) / 4', kind: 'resonant' },
		{ key: 'balun_air', formula: 'lambda / 4 to mm', kind: 'resonant' },
		{ key: 'sleeve_od', formula: '8 mm', kind: 'material', catalogue: 'copper_tube_od' },
		{ key: 'washer', formula: '11 mm', kind: 'material', catalogue: 'washer_iso7089_od' },
		{ key: 'patch_w', formula: 'patch_width(f, er)', kind: 'structural' },
		{ key: 'eeff', formula: 'patch_eeff(er, h, patch_w)', kind: 'structural' },
		{ key: 'dl', formula: 'patch_dl(h, patch_w, eeff)', kind: 'structural' },
		{ key: 'patch_l', formula: 'c / (2 * f * sqrt(eeff)) - 2 * dl', kind: 'resonant' },
		{ key: 'patch_l2', formula: 'patch_length(f, er, h)', kind: 'resonant' },
		{ key: 'ground', formula: 'patch_l + 6 * h', kind: 'structural' },
		{ key: 'inset', formula: 'patch_l / pi * acos(sqrt(50 / 200))', kind: 'structural' },
		{ key: 'board', formula: 'h', kind: 'material', catalogue: 'pcb_thickness' },
		{ key: 'fc_te11', formula: 'c / te11_cutoff(tube_id)', kind: 'structural' },
		{ key: 'guide', formula: 'guide_wavelength(f, tube_id)', kind: 'resonant' },
		{ key: 'probe', formula: 'guide / 4', kind: 'resonant' },
		{ key: 'back', formula: 'lambda / 4 * 1.02', kind: 'resonant' },
		{ key: 'probe_len', formula: '0.235 * lambda', kind: 'resonant' },
		{ key: 'can_len', formula: '0.75 * guide', kind: 'structural' },
		{ key: 'turns', formula: 'ceil(8 * lambda / (pi * 10 mm))', kind: 'count' },
		{ key: 'helix_c', formula: 'lambda * 1.0', kind: 'resonant' },
		{ key: 'helix_s', formula: 'helix_c * tan(pitch)', kind: 'structural' },
		{ key: 'helix_d', formula: 'helix_c / pi', kind: 'structural' },
		{ key: 'helix_len', formula: 'turns * helix_s', kind: 'structural' },
		{ key: 'angle', formula: 'atan(helix_s / helix_c) rad to deg', kind: 'structural' },
		{ key: 'diag', formula: 'sqrt(refl_w^2 + refl_h^2)', kind: 'structural' },
		{ key: 'slot', formula: 'lambda / 4 - 0.3 mm', kind: 'resonant' },
		{ key: 'trim', formula: 'f > 3 GHz ? 0.5 mm : 1 mm', kind: 'structural' },
		{ key: 'rl_at_2', formula: 'rl_from_vswr(2) * 1 mm', kind: 'structural' },
		{ key: 'feed', formula: 'pow(quarter * side, 0.5)', kind: 'resonant' }
	]
};

function median(xs: number[]): number {
	const s = [...xs].sort((a, b) => a - b);
	return s[Math.floor(s.length / 2)];
}

/** The bench table with every formula text made new, so compileTable has to parse it. */
function freshTable(run: number): TableDefinition {
	const salt = ` + 0 * ${run + 1} mm`;
	return {
		...BENCH_TABLE,
		rows: BENCH_TABLE.rows.map((r) =>
			r.kind === 'count' ? r : { ...r, formula: r.formula + salt }
		)
	};
}

function timeUs(fn: () => unknown): number {
	const t0 = performance.now();
	fn();
	return (performance.now() - t0) * 1000;
}

export async function benchEngine(): Promise<Record<string, number>> {
	const base = Date.now() % 100000;
	const opts = { frequencyHz: 2.4e9 };
	const coldUs = timeUs(() => evaluateTable(compileTable(freshTable(base)), opts));
	const uncached: number[] = [];
	for (let i = 1; i <= 100; i++) {
		const def = freshTable(base + i);
		uncached.push(timeUs(() => evaluateTable(compileTable(def), opts)));
	}
	const cachedCompile: number[] = [];
	for (let i = 0; i < 200; i++) cachedCompile.push(timeUs(() => compileTable(BENCH_TABLE)));

	const compiled = compileTable(BENCH_TABLE);
	const times: number[] = [];
	for (let i = 0; i < 1000; i++) {
		const f = 2.3e9 + i * 3.5e6;
		times.push(
			timeUs(() =>
				evaluateTable(compiled, { frequencyHz: f, bandHz: [2.4e9, 2.4835e9], units: 'mm' })
			)
		);
	}
	const sorted = [...times].sort((a, b) => a - b);
	return {
		rows: BENCH_TABLE.rows.length,
		first_evaluation_with_compile_cold_us: coldUs,
		evaluation_with_compile_median_us: median(uncached),
		compile_parse_cached_median_us: median(cachedCompile),
		evaluate_compiled_median_us: median(times),
		evaluate_compiled_p99_us: sorted[Math.floor(sorted.length * 0.99)]
	};
}

if (import.meta.url === `file://${process.argv[1]}`) {
	void benchEngine().then((figures) => {
		for (const [k, v] of Object.entries(figures)) console.log(`${k.padEnd(40)} ${v.toFixed(1)}`);
	});
}
