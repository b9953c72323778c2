/** Parsing and formatting of frequencies typed by people ("5.8 GHz", "433.92M", "868e6"). */

export type FrequencyParse = { ok: true; hz: number } | { ok: false; message: string };

/** Below 1 kHz a bare number is almost always a forgotten unit, not a real antenna frequency. */
const MIN_FREQUENCY_HZ = 1e3;
/** Above 1 THz the free-space wavelength is under 0.3 mm; no design here is meant for that. */
export const MAX_FREQUENCY_HZ = 1e12;
/** A measured sweep may run higher (instrument files), but not past this. */
export const MAX_SWEEP_FREQUENCY_HZ = 1e15;
const MAX_INPUT_LENGTH = 64;

/** The one table of Hz prefixes, largest first: its decimal exponent and its unit name. */
const HZ_PREFIXES = [
	{ unit: 'THz', exponent: 12 },
	{ unit: 'GHz', exponent: 9 },
	{ unit: 'MHz', exponent: 6 },
	{ unit: 'kHz', exponent: 3 },
	{ unit: 'Hz', exponent: 0 }
] as const;

export type HzUnit = (typeof HZ_PREFIXES)[number]['unit'];

/** Hz in one of each unit: HZ_PER_UNIT.MHz is 1e6. */
export const HZ_PER_UNIT = Object.fromEntries(
	HZ_PREFIXES.map((p) => [p.unit, 10 ** p.exponent])
) as Record<HzUnit, number>;

/** Decimal exponent of each accepted unit, keyed by lower case (so "mhz" and "m" mean mega). */
const UNIT_EXPONENTS: Record<string, number> = Object.fromEntries(
	HZ_PREFIXES.flatMap((p) => {
		const name = p.unit.toLowerCase();
		return name === 'hz'
			? [[name, 0]]
			: [
					[name, p.exponent],
					[name[0], p.exponent]
				];
	})
);

// Digit groups may be separated by a space, no-break space or thin space ("868 000 000 Hz").
const NUMBER_RE =
	/^([+-]?)((?:\d{1,3}(?:[ \u00a0\u2009\u202f]\d{3})+|\d+)(?:[.,]\d*)?|[.,]\d+)(?:e([+-]?\d+))?/i;

function fail(message: string): FrequencyParse {
	return { ok: false, message };
}

function quote(text: string): string {
	return text.length > 24 ? `"${text.slice(0, 24)}…"` : `"${text}"`;
}

export function parseFrequency(text: string): FrequencyParse {
	if (typeof text !== 'string') return fail('Frequency must be text, e.g. "2.45 GHz".');
	const trimmed = text.trim();
	if (trimmed === '') return fail('Enter a frequency, e.g. "2.45 GHz" or "433.92 MHz".');
	if (trimmed.length > MAX_INPUT_LENGTH) return fail('Frequency text is too long.');
	if (/^[+-]?(nan|inf(inity)?)\b/i.test(trimmed) || trimmed.includes('∞')) {
		return fail('Frequency must be a finite number, e.g. "5.8 GHz".');
	}

	const match = NUMBER_RE.exec(trimmed);
	if (!match)
		return fail(`${quote(trimmed)} is not a frequency; type a number and a unit, e.g. "5.8 GHz".`);
	const [whole, sign, digits, exponentText] = match;
	const unitText = trimmed.slice(whole.length).trim();

	let unitExponent = 0;
	if (unitText !== '') {
		const exponent = UNIT_EXPONENTS[unitText.toLowerCase()];
		if (exponent === undefined) {
			return fail(`Unknown unit ${quote(unitText)}; use Hz, kHz, MHz, GHz (or k, M, G).`);
		}
		unitExponent = exponent;
	}

	const mantissa = digits.replace(/[ \u00a0\u2009\u202f]/g, '').replace(',', '.');
	const exponent = Number(exponentText ?? '0') + unitExponent;
	// Building "5.8e9" and converting once gives the correctly rounded double (5.8 * 1e9 may not).
	const hz = Number(`${sign === '-' ? '-' : ''}${mantissa}e${exponent}`);

	if (!Number.isFinite(hz)) return fail('Frequency must be a finite number.');
	if (hz < 0) return fail('Frequency must be positive.');
	if (hz === 0) return fail('Frequency must be greater than zero.');
	if (hz > MAX_FREQUENCY_HZ) return fail('Frequency is above 1 THz; check the unit.');
	if (hz < MIN_FREQUENCY_HZ) {
		return fail('Frequency is below 1 kHz; did you forget the unit (e.g. "5.8 GHz")?');
	}
	return { ok: true, hz };
}

/** The largest unit not above |hz| (Hz for anything below 1 kHz), up to `largest`. */
export function hzUnitFor(hz: number, largest: HzUnit = 'THz'): { unit: HzUnit; divisor: number } {
	const m = Math.abs(hz);
	let i = HZ_PREFIXES.findIndex((p) => p.unit === largest);
	while (i < HZ_PREFIXES.length - 1 && m < HZ_PER_UNIT[HZ_PREFIXES[i].unit]) i++;
	const unit = HZ_PREFIXES[i].unit;
	return { unit, divisor: HZ_PER_UNIT[unit] };
}

/** "5.8 GHz", "433.92 MHz", "144 MHz": up to `significant` digits, trailing zeros dropped. */
export function formatFrequency(hz: number, significant = 7): string {
	if (typeof hz !== 'number' || !Number.isFinite(hz)) return '—';
	const scale = hzUnitFor(hz);
	const digits = Math.min(Math.max(Math.round(significant), 1), 15);
	let text = (hz / scale.divisor).toPrecision(digits);
	if (text.includes('e')) text = String(Number(text));
	if (text.includes('.')) text = text.replace(/0+$/, '').replace(/\.$/, '');
	return `${text} ${scale.unit}`;
}

/** Reads the `?f=` query value; a bad value falls back and explains why. */
export function parseFrequencyParam(
	value: string | null | undefined,
	fallbackHz: number
): { hz: number; message?: string } {
	if (value === null || value === undefined || value.trim() === '') return { hz: fallbackHz };
	const parsed = parseFrequency(value);
	if (parsed.ok) return { hz: parsed.hz };
	return {
		hz: fallbackHz,
		message: `Frequency ${quote(value.trim())} ignored: ${parsed.message} Showing ${formatFrequency(fallbackHz)}.`
	};
}
