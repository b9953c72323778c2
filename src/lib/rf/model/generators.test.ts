import { describe, expect, it } from 'vitest';
import { arcPoints, expandItem, helixPoints, pieceCount } from './generators';
import type { HelixWire, PlateWire } from './types';

const dist = (a: number[], b: number[]) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);

describe('arc', () => {
	it('a 360° arc closes exactly on its first point, every point on the circle', () => {
		const pts = arcPoints({
			kind: 'arc',
			centre: [0.1, 0.2, 0.3],
			plane: 'yz',
			arc_radius: 0.05,
			start_deg: 30,
			end_deg: 390,
			pieces: 8,
			radius: 1e-3
		});
		expect(pts).toHaveLength(9);
		expect(pts[8]).toBe(pts[0]);
		for (const p of pts) {
			expect(p[0]).toBeCloseTo(0.1, 15); // in the yz plane through the centre
			expect(Math.hypot(p[1] - 0.2, p[2] - 0.3)).toBeCloseTo(0.05, 14);
		}
	});

	it('runs counter-clockwise seen from the plane normal (xy: from +z)', () => {
		const [a, b] = arcPoints({
			kind: 'arc',
			centre: [0, 0, 0],
			plane: 'xy',
			arc_radius: 1,
			start_deg: 0,
			end_deg: 90,
			pieces: 2,
			radius: 1e-3
		});
		expect(a[0] * b[1] - a[1] * b[0]).toBeGreaterThan(0); // (a × b)·ẑ > 0
	});
});

describe('helix', () => {
	const h: HelixWire = {
		kind: 'helix',
		base: [0, 0, 0.01],
		axis: 'z',
		turns: 3,
		pitch: 0.02,
		helix_radius: 0.03,
		pieces_per_turn: 12,
		hand: 'right',
		radius: 1e-3
	};

	it('turns × pieces per turn pieces on the cylinder, rising one pitch per turn', () => {
		const pts = helixPoints(h);
		expect(pieceCount(h)).toBe(36);
		expect(pts).toHaveLength(37);
		for (const p of pts) expect(Math.hypot(p[0], p[1])).toBeCloseTo(0.03, 14);
		expect(pts[12][2] - pts[0][2]).toBeCloseTo(0.02, 14);
		expect(pts[36][2]).toBeCloseTo(0.01 + 3 * 0.02, 14);
		expect(dist(pts[0], [0.03, 0, 0.01])).toBeLessThan(1e-15); // starts at 0°, on +x
	});

	it('right-handed turns counter-clockwise seen from the tip as it rises; left the other way', () => {
		const turn = (hand: 'right' | 'left') => {
			const [a, b] = helixPoints({ ...h, hand });
			return Math.sign(a[0] * b[1] - a[1] * b[0]);
		};
		expect(turn('right')).toBe(1);
		expect(turn('left')).toBe(-1);
	});

	it('other axes keep the right-hand sense (x axis: y → z)', () => {
		const pts = helixPoints({ ...h, axis: 'x', base: [0, 0, 0] });
		expect(pts[3][0]).toBeGreaterThan(0); // advances along +x
		expect(pts[1][1] * pts[2][2] - pts[1][2] * pts[2][1]).toBeGreaterThan(0); // (p1 × p2)·x̂ > 0
	});
});

describe('plates', () => {
	const plate = (shape: PlateWire['shape'], extra: Partial<PlateWire>): PlateWire => ({
		kind: 'plate',
		shape,
		centre: [0, 0, 0],
		plane: 'xy',
		mesh: 0.02,
		radius: 5e-4,
		...extra
	});

	it('a rectangle: a grid of pieces no longer than the mesh, edges included', () => {
		const p = plate('rectangle', { centre: [0, 0, 0.1], width: 0.1, height: 0.05 });
		const { pieces, path } = expandItem(p, 0);
		expect(path).toBe(false);
		// ⌈0.1/0.02⌉ = 5 cells across, ⌈0.05/0.02⌉ = 3 up: 5·4 + 3·6 pieces
		expect(pieces).toHaveLength(38);
		expect(pieceCount(p)).toBe(38);
		for (const q of pieces) {
			expect(dist(q.from, q.to)).toBeLessThanOrEqual(0.02 + 1e-12);
			expect(q.from[2]).toBe(0.1);
			expect(Math.abs(q.from[0])).toBeLessThanOrEqual(0.05 + 1e-15);
		}
	});

	it('a disc: rings and spokes inside the diameter, chords ≤ mesh, all nodes shared', () => {
		const p = plate('disc', { plane: 'zx', diameter: 0.12 });
		const { pieces } = expandItem(p, 2);
		expect(pieces.length).toBeLessThanOrEqual(pieceCount(p));
		const ends = new Map<string, number>();
		for (const q of pieces) {
			expect(dist(q.from, q.to)).toBeLessThanOrEqual(0.02 * (1 + 1e-9));
			expect(q.item).toBe(2);
			for (const e of [q.from, q.to]) {
				expect(e[1]).toBe(0); // zx plane through y = 0
				expect(Math.hypot(e[0], e[2])).toBeLessThanOrEqual(0.06 + 1e-12);
				ends.set(e.join(','), (ends.get(e.join(',')) ?? 0) + 1);
			}
		}
		// every node joins at least two pieces: the grid has no loose ends
		for (const n of ends.values()) expect(n).toBeGreaterThanOrEqual(2);
		// the rim has ≥ π·0.12/0.02 ≈ 19 chords
		expect(
			[...ends.keys()].filter(
				(k) => Math.abs(Math.hypot(...k.split(',').map(Number)) - 0.06) < 1e-12
			).length
		).toBeGreaterThanOrEqual(19);
	});
});
