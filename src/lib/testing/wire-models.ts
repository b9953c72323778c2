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

/**
 * A 6-turn axial-mode helix over a ground plane: circumference λ at f0, pitch angle 12.5°, wire
 * diameter 0.004 λ, fed at the ground through a 0.02 λ lead; segments for `top_hz`.
 */
export function axialHelix(
	f0: number,
	hand: 'right' | 'left',
	top_hz: number,
	sigma: number | null = null
): Geometry {
	const lambda = C0 / f0;
	const r = lambda / (2 * Math.PI);
	const lead = 0.02 * lambda;
	return geometryOf(
		{
			ground: true,
			wires: [
				{ kind: 'wire', name: 'lead', from: [r, 0, 0], to: [r, 0, lead], radius: 0.002 * lambda },
				{
					kind: 'helix',
					name: 'coil',
					base: [0, 0, lead],
					axis: 'z',
					turns: 6,
					pitch: lambda * Math.tan((12.5 * Math.PI) / 180),
					helix_radius: r,
					pieces_per_turn: 16,
					hand,
					radius: 0.002 * lambda
				}
			],
			feed: { wire: 'lead', position: 0 },
			conductivity_s_per_m: sigma
		},
		top_hz
	);
}
