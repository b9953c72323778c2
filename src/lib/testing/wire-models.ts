/** Wire models for tests of rf/model only (never imported by production code). */
import { buildGeometry, type Geometry } from '../rf/model/geometry';
import { solve } from '../rf/model/solver';
import type { WireModel } from '../rf/model/types';

export const C0 = 299_792_458; // SI Brochure 9th ed. [SI2019]

/** buildGeometry that throws on a refusal (for models a test knows are valid). */
export function geometryOf(model: WireModel, top_hz: number): Geometry {
	const g = buildGeometry(model, top_hz);
	if (!g.ok) throw new Error(g.error.message);
	return g.value;
}

/** A centre-fed dipole along z; perfect conductor unless `sigma` (S/m) is given. */
export function centreFedDipole(
	length: number,
	radius: number,
	segments: number,
	sigma: number | null = null
): Geometry {
	return geometryOf(
		{
			wires: [
				{
					kind: 'wire',
					name: 'dipole',
					from: [0, 0, -length / 2],
					to: [0, 0, length / 2],
					radius,
					segments
				}
			],
			feed: { wire: 'dipole', position: 0.5 },
			conductivity_s_per_m: sigma
		},
		C0 / length
	);
}

/** Where the input reactance crosses zero between lo and hi, by bisection on direct solves. */
export function resonanceByBisection(g: Geometry, lo: number, hi: number): number {
	for (let i = 0; i < 40; i++) {
		const m = (lo + hi) / 2;
		if (solve(g, m).z_in.im < 0) lo = m;
		else hi = m;
	}
	return (lo + hi) / 2;
}
