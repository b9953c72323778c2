/** Parsing and formatting of frequencies typed by people ("5.8 GHz", "433.92M", "868e6"). */

export type FrequencyParse = { ok: true; hz: number } | { ok: false; message: string };

/** Below 1 kHz a bare number is almost always a forgotten unit, not a real antenna frequency. */
export const MIN_FREQUENCY_HZ = 1e3;
export const MAX_FREQUENCY_HZ = 1e12;
const MAX_INPUT_LENGTH = 64;

/** Decimal exponent of each accepted unit, keyed by lower case (so "mhz" and "m" mean mega). */
const UNIT_EXPONENTS: Record<string, number> = {
	hz: 0,
	k: 3,
	khz: 3,
	m: 6,
	mhz: 6,
	g: 9,
	ghz: 9,
	t: 12,
	thz: 12
};

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

const SCALES: { min: number; div: number; unit: string }[] = [
	{ min: 1e12, div: 1e12, unit: 'THz' },
	{ min: 1e9, div: 1e9, unit: 'GHz' },
	{ min: 1e6, div: 1e6, unit: 'MHz' },
	{ min: 1e3, div: 1e3, unit: 'kHz' },
	{ min: 0, div: 1, unit: 'Hz' }
];

/** "5.8 GHz", "433.92 MHz", "144 MHz": up to `significant` digits, trailing zeros dropped. */
export function formatFrequency(hz: number, significant = 7): string {
	if (typeof hz !== 'number' || !Number.isFinite(hz)) return '—';
	const magnitude = Math.abs(hz);
	const scale = SCALES.find((s) => magnitude >= s.min) ?? SCALES[SCALES.length - 1];
	const digits = Math.min(Math.max(Math.round(significant), 1), 15);
	let text = (hz / scale.div).toPrecision(digits);
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
