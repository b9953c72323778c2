/**
 * The one reader of a view from a URL: ?f= (Hz, or text with a unit), ?units=, ?band= (preset id).
 * The design page, the build sheet, the CSV export and the dimensions API all read it here; the
 * page shows `notice` and carries on, the API refuses the first problem.
 */
import { bandById } from './bands';
import { parseFrequency, parseFrequencyParam } from './frequency';
import { UNITS, type Units } from './length';

export interface ViewState {
	frequencyHz: number;
	units: Units;
	/** The chosen band preset, if any. */
	bandId: string | null;
	/** Band edges for tolerances: the preset's, else the claimed band at the design frequency. */
	band: [number, number] | undefined;
}

export interface ViewProblem {
	field: 'f' | 'units' | 'band';
	message: string;
}

/** What a revision contributes: its design frequency and claimed band. */
export interface ViewRevision {
	designHz: number;
	claimLoHz: number | null;
	claimHiHz: number | null;
}

function parseUnits(value: string | null): Units {
	return UNITS.includes(value as Units) ? (value as Units) : 'mm';
}

export function parseViewState(
	params: URLSearchParams,
	r: ViewRevision
): { view: ViewState; problems: ViewProblem[]; notice?: string } {
	const problems: ViewProblem[] = [];
	const fText = params.get('f');
	const lenient = parseFrequencyParam(fText, r.designHz);
	if (lenient.message) {
		const strict = parseFrequency(fText!);
		problems.push({ field: 'f', message: strict.ok ? lenient.message : strict.message });
	}
	let hz = lenient.hz;
	const unitsText = params.get('units');
	if (unitsText !== null && parseUnits(unitsText) !== unitsText) {
		problems.push({
			field: 'units',
			message: `units must be ${UNITS.join(', ').replace(/, (?=[^,]*$)/, ' or ')}.`
		});
	}
	const bandText = params.get('band');
	const preset = bandText ? bandById(bandText) : undefined;
	if (bandText && !preset) problems.push({ field: 'band', message: 'Unknown band preset.' });
	// Without JavaScript a newly chosen preset arrives beside the old f: outside the preset, its centre wins.
	if (preset && (hz < preset.lo_hz || hz > preset.hi_hz)) hz = preset.centre_hz;
	const claim: [number, number] | undefined =
		r.claimLoHz && r.claimHiHz ? [r.claimLoHz, r.claimHiHz] : undefined;
	const band: [number, number] | undefined = preset
		? [preset.lo_hz, preset.hi_hz]
		: hz === r.designHz
			? claim
			: undefined;
	const notice =
		lenient.message ?? (bandText && !preset ? 'Unknown band preset ignored.' : undefined);
	return {
		view: { frequencyHz: hz, units: parseUnits(unitsText), bandId: preset?.id ?? null, band },
		problems,
		notice
	};
}
