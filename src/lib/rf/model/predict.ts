import { z } from '../../zod';
import { radiation, type Radiation } from './farfield';
import { buildGeometry, type Geometry } from './geometry';
import { MAX_FREQUENCY_HZ } from '../units/frequency';
import { MAX_SEGMENTS, MAX_SWEEP_POINTS, MIN_FREQUENCY_HZ } from './limits';
import { describeIssue, fieldWords, parseModel, pathText } from './parse';
import { solve } from './solver';
import { predictSweep, type PredictedSweep } from './sweep';
import type { ModelIssue, Vec3, WireModel } from './types';

/**
 * One call from plain data to plain data — the unit of work for a worker thread: parse the model,
 * check and discretise it, sweep the impedance, and optionally the radiation at one frequency.
 * Nothing here throws for bad input; a failure is `{ ok: false, error }` naming the field or wire.
 */

const requestSchema = z.strictObject({
	model: z.unknown(),
	lo_hz: z.number().min(MIN_FREQUENCY_HZ).max(MAX_FREQUENCY_HZ),
	hi_hz: z.number().min(MIN_FREQUENCY_HZ).max(MAX_FREQUENCY_HZ),
	points: z.number().int().min(1).max(MAX_SWEEP_POINTS).optional(),
	reference_ohms: z.number().gt(0).max(1e6).optional(),
	radiation_hz: z.number().min(MIN_FREQUENCY_HZ).max(MAX_FREQUENCY_HZ).optional(),
	max_segments: z.number().int().min(1).max(MAX_SEGMENTS).optional()
});

/** Segments as [x0, y0, z0, x1, y1, z1, radius] (metres), the feed and loads, for a drawing. */
export interface GeometryView {
	segments: number[][];
	feed: Vec3;
	loads: Vec3[];
	ground: boolean;
}

export interface PredictResult extends PredictedSweep {
	segments: number;
	warnings: string[];
	view: GeometryView;
	/** At `radiation_hz`: input impedance, radiation, and each segment's current at its start and end as [re, im, re, im] (A for 1 V at the feed, along the segment as drawn in `view`). */
	radiation:
		| (Radiation & {
				frequency_hz: number;
				z_re: number;
				z_im: number;
				segment_currents: number[][];
		  })
		| null;
	elapsed_ms: number;
}

export type PredictResponse =
	{ ok: true; result: PredictResult } | { ok: false; error: ModelIssue };

function geometryView(g: Geometry): GeometryView {
	const S = g.segments;
	const segments: number[][] = [];
	for (let i = 0; i < S.n; i++) {
		const l = S.len[i];
		segments.push([
			S.sx[i],
			S.sy[i],
			S.sz[i],
			S.sx[i] + l * S.ux[i],
			S.sy[i] + l * S.uy[i],
			S.sz[i] + l * S.uz[i],
			S.rad[i]
		]);
	}
	return {
		segments,
		feed: g.feed.point,
		loads: g.loads.map((l) => l.port.point),
		ground: g.images !== null
	};
}

/** Checks a model for the editor without solving it: its drawing and warnings, or the failure. */
export function checkModel(
	model: unknown,
	top_hz: number,
	maxSegments = MAX_SEGMENTS
):
	| { ok: true; view: GeometryView; segments: number; warnings: string[] }
	| { ok: false; error: ModelIssue } {
	const parsed = parseModel(model);
	if (!parsed.ok) return parsed;
	const g = buildGeometry(parsed.value, top_hz, { maxSegments });
	if (!g.ok) return g;
	return {
		ok: true,
		view: geometryView(g.value),
		segments: g.value.segments.n,
		warnings: g.warnings
	};
}

export function predict(request: unknown): PredictResponse {
	const t0 = performance.now();
	const r = requestSchema.safeParse(request);
	if (!r.success) {
		const issue = r.error.issues[0];
		const path = issue.path.filter((k): k is string | number => typeof k !== 'symbol');
		return {
			ok: false,
			error: {
				message: `${fieldWords(path) || 'request'}: ${describeIssue(issue)}`,
				path: pathText(path)
			}
		};
	}
	const q = r.data;
	const points = q.points ?? 101;
	if (!(q.hi_hz > q.lo_hz) && !(points === 1 && q.hi_hz === q.lo_hz))
		return {
			ok: false,
			error: { message: 'hi hz must be above lo hz (or equal to it with points 1)', path: 'hi_hz' }
		};
	const parsed = parseModel(q.model);
	if (!parsed.ok)
		return {
			ok: false,
			error: { ...parsed.error, path: `model${parsed.error.path ? '.' + parsed.error.path : ''}` }
		};
	const model: WireModel = parsed.value;
	const top = Math.max(q.hi_hz, q.radiation_hz ?? 0);
	const built = buildGeometry(model, top, { maxSegments: q.max_segments });
	if (!built.ok) return { ok: false, error: { ...built.error, path: `model.${built.error.path}` } };
	const g = built.value;
	const z0 = q.reference_ohms ?? 50;
	const sweep = predictSweep(g, { lo_hz: q.lo_hz, hi_hz: q.hi_hz, points, reference_ohms: z0 });
	let rad: PredictResult['radiation'] = null;
	if (q.radiation_hz !== undefined) {
		const sol = solve(g, q.radiation_hz);
		const segment_currents = Array.from({ length: g.segments.n }, (_, p) => [
			sol.i_start[2 * p],
			sol.i_start[2 * p + 1],
			sol.i_end[2 * p],
			sol.i_end[2 * p + 1]
		]);
		rad = {
			frequency_hz: q.radiation_hz,
			z_re: sol.z_in.re,
			z_im: sol.z_in.im,
			segment_currents,
			...radiation(sol)
		};
	}
	return {
		ok: true,
		result: {
			...sweep,
			segments: g.segments.n,
			warnings: built.warnings,
			view: geometryView(g),
			radiation: rad,
			elapsed_ms: performance.now() - t0
		}
	};
}
