import { describe, expect, it } from 'vitest';
import {
	constantRCircle,
	constantRSvg,
	constantXArcPath,
	constantXCircle,
	gammaFromImpedance,
	toChart,
	tracePoints
} from './smith';

const frame = { cx: 200, cy: 200, radius: 180 };

/** Centre of an SVG arc from its endpoints and flags (SVG 1.1 Implementation Notes F.6.5, equal radii). */
function arcCentre(
	x1: number,
	y1: number,
	r: number,
	large: number,
	sweep: number,
	x2: number,
	y2: number
) {
	const mx = (x1 + x2) / 2;
	const my = (y1 + y2) / 2;
	const dx = (x1 - x2) / 2;
	const dy = (y1 - y2) / 2;
	const k = Math.sqrt(Math.max(0, (r * r - dx * dx - dy * dy) / (dx * dx + dy * dy)));
	const s = large === sweep ? -1 : 1;
	return { x: mx + s * k * dy, y: my - s * k * dx };
}

describe('Smith chart geometry', () => {
	it('Γ from normalized impedance: z = 1 is the centre, z = 1 + j1 is 0.2 + j0.4', () => {
		// [calc] Γ = (z − 1)/(z + 1) (Pozar 4th ed. §2.3); 50 + j50 Ω at Z0 = 50 Ω → j/(2 + j) = 0.2 + j0.4
		expect(gammaFromImpedance(1, 0)).toEqual({ re: 0, im: 0 });
		const g = gammaFromImpedance(1, 1);
		expect(g.re).toBeCloseTo(0.2, 12);
		expect(g.im).toBeCloseTo(0.4, 12);
	});

	it('maps Γ to SVG with y pointing down (inductive half on top)', () => {
		expect(toChart(0, 0, frame)).toEqual({ x: 200, y: 200 });
		expect(toChart(1, 0, frame)).toEqual({ x: 380, y: 200 });
		expect(toChart(0, 1, frame)).toEqual({ x: 200, y: 20 });
		expect(tracePoints([0, -1], [0.5, 0], frame)).toBe('200,110 20,200');
	});

	it('constant-r circles: r = 0 is the rim, r = 1 has centre 0.5 and radius 0.5', () => {
		expect(constantRCircle(0)).toEqual({ cx: 0, cy: 0, r: 1 });
		expect(constantRCircle(1)).toEqual({ cx: 0.5, cy: 0, r: 0.5 });
		expect(constantRSvg(1, frame)).toEqual({ cx: 290, cy: 200, r: 90 });
	});

	it('every z = r + jx lies on its constant-r and constant-x circles', () => {
		for (const [r, x] of [
			[0.2, 0.5],
			[1, -1],
			[2, 5],
			[5, -0.2]
		]) {
			const g = gammaFromImpedance(r, x);
			const cr = constantRCircle(r);
			const cx = constantXCircle(x);
			expect(Math.hypot(g.re - cr.cx, g.im - cr.cy)).toBeCloseTo(cr.r, 12);
			expect(Math.hypot(g.re - cx.cx, g.im - cx.cy)).toBeCloseTo(cx.r, 12);
		}
	});

	it('constant-x arcs run from Γ = 1 to the rim and bend through the inside of the chart', () => {
		for (const x of [0.2, 1, 5, -0.5, -2]) {
			const d = constantXArcPath(x, frame);
			const n = d.match(/-?\d+(\.\d+)?/g)!.map(Number);
			const [x1, y1, r, , , large, sweep, x2, y2] = n;
			expect([x1, y1]).toEqual([380, 200]);
			const rim = toChart(gammaFromImpedance(0, x).re, gammaFromImpedance(0, x).im, frame);
			expect(x2).toBeCloseTo(rim.x, 2);
			expect(y2).toBeCloseTo(rim.y, 2);
			expect(Math.hypot(x2 - 200, y2 - 200)).toBeCloseTo(180, 2);
			// the centre SVG reconstructs from the flags must be the constant-x circle's centre
			const c = arcCentre(x1, y1, r, large, sweep, x2, y2);
			const want = toChart(1, 1 / x, frame);
			expect(c.x).toBeCloseTo(want.x, 1);
			expect(c.y).toBeCloseTo(want.y, 1);
		}
	});

	it('refuses x = 0 (the real axis is a line, not a circle)', () => {
		expect(() => constantXCircle(0)).toThrow(RangeError);
	});
});
