import { describe, expect, it } from 'vitest';
import { parseSweep } from '../sweeps/sweep';
import { checkModel, predict, type PredictResult } from './predict';
import { reflection } from './sweep';
import { predictedTouchstone } from './touchstone';

const C0 = 299_792_458;
const f0 = 435e6;
const lambda = C0 / f0;
// a ground-plane antenna in free space: a whip and four drooping radials, fed where they meet
const model = {
	wires: [
		{ name: 'whip', from: [0, 0, 0], to: [0, 0, 0.24 * lambda], radius: 1e-3 },
		...[0, 90, 180, 270].map((deg) => ({
			from: [0, 0, 0],
			to: [
				0.25 * lambda * Math.cos((deg * Math.PI) / 180),
				0.25 * lambda * Math.sin((deg * Math.PI) / 180),
				-0.1
			],
			radius: 1e-3
		}))
	],
	feed: { wire: 'whip', position: 0 }
};
const request = { model, lo_hz: 0.8 * f0, hi_hz: 1.2 * f0, points: 81, reference_ohms: 50 };

describe('predict: plain data in, plain data out', () => {
	it('refuses bad requests with the field named, and never throws', () => {
		const bad = (r: unknown) => {
			const out = predict(r);
			if (out.ok) throw new Error('expected a refusal');
			return out.error;
		};
		expect(bad({ ...request, lo_hz: 'low' })).toMatchObject({
			message: 'lo hz: must be a finite number',
			path: 'lo_hz'
		});
		expect(bad({ ...request, hi_hz: 0.5 * f0 }).path).toBe('hi_hz');
		expect(bad({ ...request, points: 1e6 }).path).toBe('points');
		expect(bad({ ...request, extra: 1 }).message).toMatch(/extra/);
		expect(bad({ ...request, model: { ...model, wires: [] } }).path).toBe('model.wires');
		// a sixth wire starting on the whip's middle
		const crossing = {
			...model,
			wires: [...model.wires, { from: [0, 0, 0.1], to: [0.1, 0, 0.1], radius: 1e-3 }]
		};
		expect(bad({ ...request, model: crossing })).toMatchObject({
			message: expect.stringMatching(/^wire 1 "whip" crosses or touches wire 6/),
			path: 'model.wires[5]'
		});
		expect(bad({ ...request, max_segments: 3 }).message).toMatch(/more than the limit of 3/);
		for (const r of [null, 42, 'x', [], {}]) expect(predict(r).ok).toBe(false);
	});

	it('gives a JSON-safe result: sweep, fit check, drawing, and radiation when asked', () => {
		const out = predict({ ...request, radiation_hz: f0 });
		if (!out.ok) throw new Error(out.error.message);
		const r: PredictResult = JSON.parse(JSON.stringify(out.result));
		expect(r).toEqual(out.result); // nothing lost on the way through JSON (no NaN, no Infinity)
		expect(r.points).toHaveLength(81);
		expect(r.reference_ohms).toBe(50);
		expect(r.fit!.within_tolerance).toBe(true);
		expect(r.resonance_hz).toBeGreaterThan(0.8 * f0);
		expect(r.view.segments).toHaveLength(r.segments);
		expect(r.view.feed).toEqual([0, 0, 0]);
		expect(r.radiation!.beam.directivity_dbi).toBeGreaterThan(0);
		expect(r.radiation!.cuts).toHaveLength(2);
		// the whip's current at the feed is 1/Z_in for 1 V (Ohm's law), and falls to 0 at its top
		const [re, im] = r.radiation!.segment_currents[0];
		const z = { re: r.radiation!.z_re, im: r.radiation!.z_im };
		const m = z.re * z.re + z.im * z.im;
		expect(re).toBeCloseTo(z.re / m, 12);
		expect(im).toBeCloseTo(-z.im / m, 12);
	});

	it('checkModel validates for the editor without solving', () => {
		const ok = checkModel(model, 1.2 * f0);
		expect(ok.ok && ok.segments).toBeGreaterThan(5);
		const bad = checkModel({ ...model, feed: { wire: 'whip', position: 2 } }, f0);
		expect(!bad.ok && bad.error.message).toMatch(/^feed: position must lie between 0 and 1/);
	});
});

describe('Touchstone 1-port of a prediction', () => {
	it('reads back through the sweep parser to the same reflection, marked as predicted', () => {
		const out = predict(request);
		if (!out.ok) throw new Error(out.error.message);
		const text = predictedTouchstone(out.result);
		expect(text).toMatch(/^! Predicted by a thin-wire method-of-moments model, not measured\./);
		expect(text).toMatch(/^# MHz S RI R 50$/m);
		const back = parseSweep(text);
		if (!back.ok) throw new Error(back.error.message);
		expect(back.sweep.f_hz).toHaveLength(81);
		out.result.points.forEach((p, i) => {
			const g = reflection({ re: p.z_re, im: p.z_im }, 50);
			// printed two digits finer than the 1.0875 MHz spacing: to 10 kHz
			expect(Math.abs(back.sweep.f_hz[i] - p.frequency_hz)).toBeLessThanOrEqual(5e3 + 1e-6);
			expect(back.sweep.re[i]).toBeCloseTo(g.re, 8);
			expect(back.sweep.im[i]).toBeCloseTo(g.im, 8);
		});
	});
});
