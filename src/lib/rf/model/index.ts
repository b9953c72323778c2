/**
 * rf/model — wire antennas as plain data, solved by a thin-wire method of moments (solver.ts names
 * the formulation and its sources). Pure TypeScript: no framework, server or DOM imports.
 *
 * Data flow
 *   template (design file: scalars are numbers or formula strings)
 *     parseModelTemplate(json) → evaluateModelTemplate(t, (formula, path) => number | { error })
 *   or evaluated model (API: every scalar a number, SI units: metres, degrees, ohms, henries, farads)
 *     parseModel(json)
 *   → WireModel → buildGeometry(model, top_hz, { maxSegments?, ports? }) (expand arcs/helices/plates, check,
 *     cut into segments; failures name the wire: ModelResult { ok, error: { message, path, item } })
 *   → solve(geometry, f_hz)          one frequency: z_in, segment currents, powers
 *     predictSweep(geometry, {...})  band: fitted impedance, resonance, VSWR ≤ 2 band, fit check
 *     radiation(solution)            beam, gain/directivity, efficiency, F/B, axial ratio, two cuts
 *     solvePorts(geometry, geometry.ports, f)  n-port Z matrix (feed + options.ports; reciprocity, coupling)
 *
 * For a worker thread: `predict(request)` takes and returns plain JSON-safe data
 *   request  { model, lo_hz, hi_hz, points?, reference_ohms?, radiation_hz?, max_segments? }
 *   response { ok: true, result: { reference_ohms, resonance_hz, vswr2_band, min_vswr, points:
 *              [{ frequency_hz, z_re, z_im, vswr }], fit, segments, warnings, view, radiation,
 *              elapsed_ms } } | { ok: false, error: { message, path } }
 *   (the API's `frequency_hz` is the route's own: the frequency the design was rescaled to).
 * `checkModel(model, top_hz)` validates for the editor without solving and returns a drawing
 * (`view`: segments, feed, loads, ground). `predictedTouchstone(result)` writes the prediction as
 * a Touchstone 1-port file.
 *
 * Conventions: z up; a ground plane is z = 0; a helix or a directional design points along +z;
 * feeds and loads sit at a position 0…1 along a named (or 1-based numbered) wire, arc or helix;
 * time dependence e^{jωt} (inductive reactance positive); RHCP/LHCP per IEEE Std 145.
 * Limits (MAX_SEGMENTS, MAX_WIRES, …) are in limits.ts.
 */

export type {
	ArcWire,
	HelixWire,
	LumpedLoad,
	ModelIssue,
	ModelItem,
	ModelResult,
	ModelTemplate,
	Plane,
	PlateWire,
	Scalar,
	StraightWire,
	Vec3,
	WireModel,
	WirePoint
} from './types';
export { parseModel, parseModelTemplate, evaluateModelTemplate } from './parse';
export { buildGeometry, type Geometry, type GeometryOptions, type Port } from './geometry';
export { defaultSegments } from './segments';
export { solve, solvePorts, impedanceMatrix, type Complex, type Solution } from './solver';
export {
	farField,
	gainAt,
	polarization,
	radiation,
	radiatedPower,
	type FarField,
	type PatternCut,
	type Polarization,
	type Radiation
} from './farfield';
export {
	predictSweep,
	summarizeImpedance,
	reflection,
	vswrOf,
	type FitCheck,
	type ImpedanceSummary,
	type PredictedPoint,
	type PredictedSweep,
	type SweepOptions
} from './sweep';
export {
	predict,
	checkModel,
	geometryView,
	type GeometryView,
	type PredictRequest,
	type PredictResponse,
	type PredictResult
} from './predict';
export { predictedTouchstone } from './touchstone';
export * from './limits';
