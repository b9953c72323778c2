/** Words for sweeps on the design page: the claim check verdict and return loss at a VSWR ceiling. */
import { formatFrequency } from '$lib/rf/units/frequency';

export interface ClaimView {
	pass: boolean;
	worst_vswr_in_band: number | null;
	miss_lo_hz: number | null;
	miss_hi_hz: number | null;
	band_lo_hz: number;
	band_hi_hz: number;
	vswr_max: number;
	scaled: boolean;
}

const mhz = (hz: number) => {
	const m = hz / 1e6;
	return `${m >= 100 ? m.toFixed(0) : m >= 10 ? m.toFixed(1) : m.toFixed(2)} MHz`;
};

/** "Meets the claim …" or "Misses the claim: … short by 97 MHz at the top …". */
export function claimVerdict(c: ClaimView): { pass: boolean; headline: string; detail: string } {
	const band = `${formatFrequency(c.band_lo_hz, 5)} – ${formatFrequency(c.band_hi_hz, 5)}`;
	const worst =
		c.worst_vswr_in_band === null ? null : `worst VSWR in band ${c.worst_vswr_in_band.toFixed(2)}`;
	const target = `VSWR ≤ ${c.vswr_max} over ${band}${c.scaled ? ' (claim moved to the build frequency)' : ''}`;
	if (c.pass) return { pass: true, headline: 'Meets the claim', detail: `${target}; ${worst}.` };
	if (c.worst_vswr_in_band === null) {
		return {
			pass: false,
			headline: 'Not checked',
			detail: `The sweep does not reach the claimed band (${target}).`
		};
	}
	if (c.miss_lo_hz === null || c.miss_hi_hz === null) {
		return {
			pass: false,
			headline: 'Misses the claim',
			detail: `No point of the sweep reaches VSWR ≤ ${c.vswr_max}; ${worst} (${target}).`
		};
	}
	const parts: string[] = [];
	if (c.miss_lo_hz > 0) parts.push(`${mhz(c.miss_lo_hz)} at the bottom`);
	if (c.miss_hi_hz > 0) parts.push(`${mhz(c.miss_hi_hz)} at the top`);
	const short = parts.length
		? `the VSWR ≤ ${c.vswr_max} band falls short by ${parts.join(' and ')}`
		: 'the band dips above the ceiling inside it';
	return {
		pass: false,
		headline: 'Misses the claim',
		detail: `${capital(short)}; ${worst} (${target}).`
	};
}

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** Return loss in dB at a VSWR: RL = −20·log10((s − 1)/(s + 1)). */
export function returnLossAtVswr(vswr: number): number {
	return -20 * Math.log10((vswr - 1) / (vswr + 1));
}

export function fileSize(bytes: number): string {
	return bytes < 1024
		? `${bytes} B`
		: bytes < 1024 * 1024
			? `${(bytes / 1024).toFixed(0)} kB`
			: `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/** A VSWR figure for the measurement list; null (|S11| ≥ 1, infinite VSWR) is off the scale. */
export function vswrText(vswr: number | null): string {
	return vswr === null ? 'off the scale' : vswr.toFixed(2);
}
