import { bandById } from '$lib/rf/catalogues/bands';
import { parseFrequencyParam } from '$lib/rf/units/frequency';
import type { Units } from '$lib/rf/units/length';
import type { PageLoad } from './$types';

export const prerender = false;

export const load: PageLoad = ({ url }) => {
	const q = url.searchParams;
	// the sheet opens on the 2.4 GHz ISM band; an empty band field means "no preset"
	const preset = bandById(q.has('band') ? (q.get('band') ?? '') : 'ism-2g4');
	const f = parseFrequencyParam(q.get('f'), 2.45e9);
	const u = q.get('units');
	const units: Units = u === 'in' || u === 'in_frac' ? u : 'mm';
	// Without JavaScript a newly picked preset arrives beside the old f: a frequency outside the
	// preset means the preset was just chosen, so its centre wins.
	const hz = preset && (f.hz < preset.lo_hz || f.hz > preset.hi_hz) ? preset.centre_hz : f.hz;
	return {
		hz,
		units,
		band: preset ? ([preset.lo_hz, preset.hi_hz] as [number, number]) : null,
		message: f.message
	};
};
