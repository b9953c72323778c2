import { parseViewState } from '$lib/rf/units/view-state';
import type { PageLoad } from './$types';

export const prerender = false;

// A pretend revision for the sheet: designed at 2.45 GHz, no claimed band.
const SAMPLE = { designHz: 2.45e9, claimLoHz: null, claimHiHz: null };

export const load: PageLoad = ({ url }) => {
	const q = new URLSearchParams(url.searchParams);
	// the sheet opens on the 2.4 GHz ISM band; an empty band field means "no preset"
	if (!q.has('band')) q.set('band', 'ism-2g4');
	const { view, notice } = parseViewState(q, SAMPLE);
	return { hz: view.frequencyHz, units: view.units, bandId: view.bandId, message: notice };
};
