import { pathToFileURL } from 'node:url';
import { complexMatrix, luFactor } from '../src/lib/rf/model/complex-lu';
import { buildGeometry, type Geometry } from '../src/lib/rf/model/geometry';
import { solve } from '../src/lib/rf/model/solver';
import { predictSweep } from '../src/lib/rf/model/sweep';
import type { WireModel } from '../src/lib/rf/model/types';
import { seededRandom } from '../src/lib/rf/sweeps/synthetic';
import { axialHelix } from '../src/lib/testing/wire-models';

/**
 * Wire-model solver figures: a 101-point predicted sweep of a 60-segment dipole (target < 100 ms),
 * of a 6-turn helix over a ground plane with about 200 segments (target < 2 s), and how one
 * solve grows with segments, with the share of the LU beside an LU alone of the same order.
 */

const C0 = 299_792_458;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1];

function geometry(model: WireModel, top_hz: number): Geometry {
	const g = buildGeometry(model, top_hz);
	if (!g.ok) throw new Error(g.error.message);
	return g.value;
}

const dipole = (f0: number, segments: number, radius = 5e-4) =>
	geometry(
		{
			wires: [
				{
					kind: 'wire',
					name: 'd',
					from: [0, 0, -0.24 * (C0 / f0)],
					to: [0, 0, 0.24 * (C0 / f0)],
					radius,
					segments
				}
			],
			feed: { wire: 'd', position: 0.5 }
		},
		1.3 * f0
	);

/** Median time of `runs` fresh sweeps (each on a fresh geometry, so nothing is kept between runs). */
function timeSweep(make: () => Geometry, lo: number, hi: number, runs: number) {
	const times: number[] = [];
	let solves = 0;
	let segments = 0;
	for (let i = 0; i < runs + 1; i++) {
		const g = make();
		const t0 = performance.now();
		const s = predictSweep(g, { lo_hz: lo, hi_hz: hi, points: 101, reference_ohms: 50 });
		if (i > 0) times.push(performance.now() - t0); // the first run warms the JIT
		solves = s.fit?.direct_solves ?? 101;
		segments = g.segments.n;
	}
	return { ms: median(times), solves, segments };
}

function luAlone(n: number, runs: number): number {
	const rand = seededRandom(n);
	const a = complexMatrix(n);
	for (let i = 0; i < a.length; i++) a[i] = rand() - 0.5;
	const times: number[] = [];
	for (let i = 0; i < runs + 1; i++) {
		const copy = Float64Array.from(a);
		const t0 = performance.now();
		luFactor(copy, n);
		if (i > 0) times.push(performance.now() - t0);
	}
	return median(times);
}

export async function benchModel(
	log: (label: string, value: string) => void = (l, v) => console.log(`${l.padEnd(58)} ${v}`)
) {
	const f0 = 868e6;
	const d = timeSweep(() => dipole(f0, 60), 0.7 * f0, 1.3 * f0, 9);
	log(
		`dipole, ${d.segments} segments: 101-point predicted sweep`,
		`${d.ms.toFixed(1)} ms (${d.solves} direct solves; target < 100 ms)`
	);
	const h = timeSweep(() => axialHelix(1e9, 'right', 1.25e9, 5.8e7), 0.75e9, 1.25e9, 3);
	log(
		`6-turn helix over ground, ${h.segments} segments: 101-point sweep`,
		`${(h.ms / 1000).toFixed(2)} s (${h.solves} direct solves; target < 2 s)`
	);
	log(
		'one solve against segments (dipole, new frequency):',
		'total ms | fill ms | LU ms | LU share | LU alone ms'
	);
	for (const n of [50, 100, 200, 400]) {
		const g = dipole(f0, n, 1e-4);
		solve(g, f0); // first solve builds the geometry's fill plan
		const runs = n >= 400 ? 3 : 7;
		const total: number[] = [];
		const fill: number[] = [];
		const lu: number[] = [];
		for (let i = 0; i < runs; i++) {
			const s = solve(g, f0 * (1 + 0.01 * (i + 1)));
			total.push(s.timing.fill_ms + s.timing.lu_ms + s.timing.solve_ms);
			fill.push(s.timing.fill_ms);
			lu.push(s.timing.lu_ms);
		}
		const alone = luAlone(g.bases, runs);
		log(
			`  N = ${n} segments (${g.bases} unknowns)`,
			`${median(total).toFixed(1)} | ${median(fill).toFixed(1)} | ${median(lu).toFixed(1)} | ${((100 * median(lu)) / median(total)).toFixed(0)} % | ${alone.toFixed(1)}`
		);
	}
	return { dipole_sweep_ms: d.ms, helix_sweep_ms: h.ms };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await benchModel();
