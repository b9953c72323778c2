import type { FrequencyUnit, Sweep } from '../sweeps/types';
import { toTouchstone } from '../sweeps/synthetic';
import type { PredictedPoint } from './sweep';
import { reflection } from './sweep';

/**
 * A predicted sweep as a Touchstone 1-port file (S11 against the reference impedance), written by
 * the same writer as every other sweep here, with comment lines saying it is a prediction.
 */
export function predictedTouchstone(
	result: { reference_ohms: number; points: PredictedPoint[] },
	options: { unit?: FrequencyUnit; format?: 'DB' | 'MA' | 'RI'; comments?: string[] } = {}
): string {
	const n = result.points.length;
	const sweep: Sweep = {
		source: 'touchstone',
		z0: result.reference_ohms,
		f_hz: new Float64Array(n),
		re: new Float64Array(n),
		im: new Float64Array(n),
		comments: [],
		phase_known: true,
		version: 1
	};
	result.points.forEach((p, i) => {
		const g = reflection({ re: p.z_re, im: p.z_im }, result.reference_ohms);
		sweep.f_hz[i] = p.frequency_hz;
		sweep.re[i] = g.re;
		sweep.im[i] = g.im;
	});
	return toTouchstone(sweep, {
		unit: options.unit ?? 'MHz',
		format: options.format ?? 'RI',
		comments: [
			'Predicted by a thin-wire method-of-moments model, not measured.',
			'The model leaves out dielectrics, coax and balun, nearby objects and construction tolerances.',
			...(options.comments ?? [])
		]
	});
}
