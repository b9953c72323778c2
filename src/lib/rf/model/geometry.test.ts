import { describe, expect, it } from 'vitest';
import { buildGeometry } from './geometry';
import { defaultSegments } from './segments';
import { MAX_SEGMENTS } from './limits';
import type { ModelItem, WireModel } from './types';
import { segmentDistance } from './validate';

const C0 = 299_792_458;
const F = 1e9; // λ = 0.2998 m
const wire = (
	from: [number, number, number],
	to: [number, number, number],
	extra: Partial<ModelItem> = {}
): ModelItem => ({ kind: 'wire', from, to, radius: 1e-3, ...extra }) as ModelItem;
const dipole: WireModel = {
	wires: [wire([0, 0, -0.07], [0, 0, 0.07], { name: 'driven' })],
	feed: { wire: 'driven', position: 0.5 }
};

function refused(model: WireModel, f = F) {
	const r = buildGeometry(model, f);
	if (r.ok) throw new Error('expected a refusal');
	return r.error;
}

describe('default segments', () => {
	it('λ/20 at the top of the band, at least 4 radii, a node where the feed is', () => {
		const lambda = C0 / F;
		// 0.14 m at λ/20 = 14.99 mm → 10 segments (even already: the centre is a node)
		expect(defaultSegments(0.14, 1e-3, F, [0.5])).toBe(10);
		// 0.13 m → 9 by length, 10 to put the centre feed on a node
		expect(defaultSegments(0.13, 1e-3, F, [0.5])).toBe(10);
		// a feed a third of the way along wants a multiple of 3
		expect(defaultSegments(0.13, 1e-3, F, [1 / 3]) % 3).toBe(0);
		// thick wire: 4 radii wins over λ/20
		expect(defaultSegments(0.1, 5e-3, F, [])).toBe(Math.floor(0.1 / 0.02));
		expect(0.1 / 5 / (lambda / 20)).toBeGreaterThan(1); // (longer than λ/20, so the radius rule decided)
	});

	it('a centre-fed dipole gets one basis per interior node', () => {
		const r = buildGeometry(dipole, F);
		if (!r.ok) throw new Error(r.error.message);
		expect(r.value.segments.n).toBe(10);
		expect(r.value.bases).toBe(9);
		expect(r.value.feed.position).toBe(0.5);
		expect(r.value.feed.point[2]).toBeCloseTo(0, 15);
	});

	it('a junction of three wires has two bases there; a wire on the ground gets a half basis', () => {
		const r = buildGeometry(
			{
				ground: true,
				wires: [
					wire([0, 0, 0], [0, 0, 0.05], { name: 'mast', segments: 2 }),
					wire([0, 0, 0.05], [0.05, 0, 0.05], { segments: 2 }),
					wire([0, 0, 0.05], [0, 0.05, 0.05], { segments: 2 })
				],
				feed: { wire: 'mast', position: 0 }
			},
			F
		);
		if (!r.ok) throw new Error(r.error.message);
		// mast: 1 interior node + 1 ground node; arms: 1 interior node each; junction: 3 − 1
		expect(r.value.bases).toBe(1 + 1 + 2 + 2);
		expect(r.value.feed.bases).toHaveLength(1);
	});
});

describe('extra ports (for solvePorts)', () => {
	it('each sits on a node; a bad one is named', () => {
		const r = buildGeometry(
			{
				wires: [
					wire([0, 0, -0.07], [0, 0, 0.07], { name: 'driven' }),
					wire([0.05, 0, -0.07], [0.05, 0, 0.07], { name: 'parasite' })
				],
				feed: { wire: 'driven', position: 0.5 }
			},
			F,
			{ ports: [{ wire: 'parasite', position: 1 / 3 }] }
		);
		if (!r.ok) throw new Error(r.error.message);
		expect(r.value.ports).toHaveLength(2);
		expect(r.value.ports[0]).toBe(r.value.feed);
		expect(r.value.ports[1].position).toBeCloseTo(1 / 3, 12);
		expect(r.value.ports[1].point[2]).toBeCloseTo(-0.07 + 0.14 / 3, 12);
		const bad = buildGeometry(dipole, F, { ports: [{ wire: 'driven', position: -1 }] });
		expect(!bad.ok && bad.error).toMatchObject({
			message: 'port 2: position must lie between 0 and 1 along wire 1 "driven" (it is -1)',
			path: 'ports[0].position'
		});
	});
});

describe('refusals name the wire', () => {
	it('zero-length wire', () => {
		expect(
			refused({
				...dipole,
				wires: [...dipole.wires, wire([0.1, 0, 0], [0.1, 0, 0], { name: 'stub' })]
			}).message
		).toMatch(/^wire 2 "stub" has zero length/);
	});

	it('crossing wires, and a wire ending on another one’s middle', () => {
		const cross = refused({
			...dipole,
			wires: [...dipole.wires, wire([-0.05, 0, 0.01], [0.05, 0, 0.01], { name: 'bar' })]
		});
		expect(cross.message).toMatch(/wire 1 "driven" crosses or touches wire 2 "bar"/);
		expect(cross.path).toBe('wires[1]');
		const tee = refused({
			...dipole,
			wires: [...dipole.wires, wire([0, 0, 0.02], [0.05, 0, 0.02])]
		});
		expect(tee.message).toMatch(
			/wire 1 "driven" crosses or touches wire 2 at \(0, 0, 20\) mm; wires may meet only at shared end points/
		);
	});

	it('parallel wires closer than their radii, and wires folded back on each other', () => {
		expect(
			refused({ ...dipole, wires: [...dipole.wires, wire([0.0015, 0, -0.07], [0.0015, 0, 0.07])] })
				.message
		).toMatch(/comes within 1\.5 mm \(less than the radii\) of wire 2/);
		expect(
			refused({ ...dipole, wires: [...dipole.wires, wire([0, 0, 0.07], [0.0005, 0, 0.01])] })
				.message
		).toMatch(/folds back along wire 2/);
		expect(
			refused({ ...dipole, wires: [...dipole.wires, wire([0, 0, 0.07], [0, 0, -0.07])] }).message
		).toMatch(/runs along wire 2/);
	});

	it('wires below, along or just above a ground plane', () => {
		const g = (w: ModelItem) =>
			refused({
				ground: true,
				wires: [wire([0, 0, 0], [0, 0, 0.07], { name: 'mast' }), w],
				feed: { wire: 'mast', position: 0 }
			});
		expect(g(wire([0.02, 0, 0.02], [0.05, 0, -0.01], { name: 'dip' })).message).toBe(
			'wire 2 "dip" goes below the ground plane (z = -10 mm)'
		);
		expect(g(wire([0.02, 0, 0], [0.05, 0, 0])).message).toMatch(
			/^wire 2 lies along the ground plane/
		);
		expect(g(wire([0.02, 0, 0.0005], [0.02, 0, 0.05])).message).toMatch(
			/^wire 2 ends 0\.5 mm above the ground plane, closer than its radius/
		);
	});

	it('segments shorter than the radius', () => {
		const e = refused({
			wires: [wire([0, 0, -0.07], [0, 0, 0.07], { name: 'fat', radius: 0.01, segments: 20 })],
			feed: { wire: 'fat', position: 0.5 }
		});
		expect(e.message).toBe(
			'wire 1 "fat": its segments (7 mm) are shorter than its radius (10 mm); use fewer segments or a thinner wire'
		);
	});

	it('feeds outside a wire, at a free end, on a grid, or on a wire that does not exist', () => {
		expect(refused({ ...dipole, feed: { wire: 'driven', position: 1.5 } }).message).toBe(
			'feed: position must lie between 0 and 1 along wire 1 "driven" (it is 1.5)'
		);
		expect(refused({ ...dipole, feed: { wire: 'driven', position: 1 } }).message).toMatch(
			/^feed is at the free end of wire 1 "driven"/
		);
		expect(refused({ ...dipole, feed: { wire: 'reflector', position: 0.5 } })).toMatchObject({
			message: 'feed: there is no wire named "reflector"',
			path: 'feed.wire'
		});
		expect(refused({ ...dipole, feed: { wire: 3, position: 0.5 } }).message).toBe(
			'feed: there is no wire 3'
		);
		const plate = refused({
			...dipole,
			wires: [
				...dipole.wires,
				{
					kind: 'plate',
					name: 'sheet',
					shape: 'rectangle',
					centre: [0, 0.1, 0],
					plane: 'zx',
					width: 0.05,
					height: 0.05,
					mesh: 0.01,
					radius: 5e-4
				}
			],
			feed: { wire: 'sheet', position: 0.5 }
		});
		expect(plate.message).toBe(
			'feed: plate 2 "sheet" is a grid; put the feed on a wire, arc or helix'
		);
	});

	it('more segments than the cap, naming the biggest wire', () => {
		const e = refused({
			wires: [
				wire([0, 0, -0.07], [0, 0, 0.07], { name: 'driven' }),
				wire([0.1, 0, -10], [0.1, 0, 10], { name: 'mast' })
			],
			feed: { wire: 'driven', position: 0.5 }
		});
		expect(e.message).toMatch(
			new RegExp(`more than the limit of ${MAX_SEGMENTS} \\(wire 2 "mast" alone has \\d+\\)`)
		);
		expect(e.item).toBe(1);
		// a per-request cap below the constant
		const small = buildGeometry(dipole, F, { maxSegments: 5 });
		expect(!small.ok && small.error.message).toMatch(/more than the limit of 5/);
	});

	it('helix turns that touch, duplicate names, a bad load', () => {
		const h = refused({
			wires: [
				{
					kind: 'helix',
					name: 'coil',
					base: [0, 0, 0],
					axis: 'z',
					turns: 3,
					pitch: 0.001,
					helix_radius: 0.02,
					pieces_per_turn: 8,
					hand: 'right',
					radius: 1e-3
				}
			],
			feed: { wire: 'coil', position: 0.5 }
		});
		expect(h.message).toMatch(/^helix 1 "coil": the turns touch/);
		expect(
			refused({
				...dipole,
				wires: [...dipole.wires, wire([0.1, 0, 0], [0.2, 0, 0], { name: 'driven' })]
			}).message
		).toMatch(/^wire 2 "driven": another wire \(wire 1 "driven"\) has the same name/);
		expect(
			refused({
				...dipole,
				loads: [{ wire: 'driven', position: 0.5, arrangement: 'series', r_ohm: -5 }]
			})
		).toMatchObject({
			message: 'load 1: r_ohm must be a number of 0 or more',
			path: 'loads[0].r_ohm'
		});
	});
});

describe('segment distance (Ericson, Real-Time Collision Detection, §5.1.9) [Ericson2005]', () => {
	it('skew, parallel and degenerate segments [calc]', () => {
		expect(segmentDistance([0, 0, 0], [1, 0, 0], [0.5, 1, 1], [0.5, -1, 1]).dist).toBeCloseTo(
			1,
			15
		);
		expect(segmentDistance([0, 0, 0], [1, 0, 0], [2, 1, 0], [3, 1, 0]).dist).toBeCloseTo(
			Math.SQRT2,
			15
		);
		expect(segmentDistance([0, 0, 0], [0, 0, 0], [1, 1, 0], [1, -1, 0]).dist).toBeCloseTo(1, 15);
	});
});
