import { describe, expect, it } from 'vitest';
import { formatFrequency, parseFrequency, parseFrequencyParam } from './frequency';

// Expected values are the SI prefix definitions (k = 1e3, M = 1e6, G = 1e9; SI Brochure 9th ed.,
// Table 7) applied to the typed number: [calc] hz = number x 10^prefix.
function hzOf(text: string): number {
	const result = parseFrequency(text);
	if (!result.ok) throw new Error(`expected ${text} to parse: ${result.message}`);
	return result.hz;
}

function messageOf(text: string): string {
	const result = parseFrequency(text);
	if (result.ok) throw new Error(`expected ${text} to be rejected`);
	return result.message;
}

describe('parseFrequency', () => {
	it.each([
		['5.8 GHz', 5.8e9],
		['5800 MHz', 5.8e9],
		['433.92M', 433.92e6],
		['2.4g', 2.4e9],
		['144.3 mhz', 144.3e6],
		['868e6', 868e6],
		['868000000', 868e6],
		['1.3 GHz', 1.3e9],
		['13.56 MHz', 13.56e6],
		['27k', 27e3],
		['27 kHz', 27e3],
		['5,8 GHz', 5.8e9],
		['  2.45   GHz  ', 2.45e9],
		['2.45GHz', 2.45e9],
		['868 000 000 Hz', 868e6],
		['1.2e3 MHz', 1.2e9],
		['+915 MHz', 915e6]
	])('reads %j as %d Hz', (text, hz) => {
		// Exact equality: the parser must give the correctly rounded double, not 5.8 * 1e9 noise.
		expect(hzOf(text)).toBe(hz);
	});

	it('rejects empty input with a prompt', () => {
		expect(messageOf('')).toMatch(/enter a frequency/i);
		expect(messageOf('   ')).toMatch(/enter a frequency/i);
	});

	it('rejects text that is not a number', () => {
		expect(messageOf('abc')).toMatch(/not a frequency/i);
	});

	it('rejects zero and negative values', () => {
		expect(messageOf('0')).toMatch(/greater than zero/i);
		expect(messageOf('0 GHz')).toMatch(/greater than zero/i);
		expect(messageOf('-5')).toMatch(/positive/i);
	});

	it('rejects values above 1 THz', () => {
		expect(messageOf('1e20')).toMatch(/above 1 THz/);
		expect(messageOf('1e400')).toMatch(/finite/i);
	});

	it('rejects unknown units and names the unit', () => {
		expect(messageOf('5.8 GHzz')).toContain('"GHzz"');
		expect(messageOf('5.8 furlongs')).toMatch(/unknown unit/i);
	});

	it('rejects NaN and Infinity', () => {
		expect(messageOf('NaN')).toMatch(/finite/i);
		expect(messageOf('Infinity')).toMatch(/finite/i);
		expect(messageOf('-inf GHz')).toMatch(/finite/i);
	});

	it('flags a bare small number as a missing unit', () => {
		expect(messageOf('5')).toMatch(/forget the unit/i);
	});

	it('returns a message instead of throwing for non-string input', () => {
		const result = parseFrequency(42 as unknown as string);
		expect(result.ok).toBe(false);
	});
});

describe('formatFrequency', () => {
	it.each([
		[5.8e9, '5.8 GHz'],
		[433.92e6, '433.92 MHz'],
		[144e6, '144 MHz'],
		[2.4835e9, '2.4835 GHz'],
		[13.56e6, '13.56 MHz'],
		[27e3, '27 kHz'],
		[868e6, '868 MHz'],
		[2.45e9, '2.45 GHz'],
		[1e12, '1 THz'],
		[500, '500 Hz']
	])('formats %d Hz as %j', (hz, text) => {
		expect(formatFrequency(hz)).toBe(text);
	});

	it('drops floating-point noise', () => {
		// [calc] 0.1 + 0.2 GHz is 300000000.00000006 Hz in binary floating point.
		expect(formatFrequency((0.1 + 0.2) * 1e9)).toBe('300 MHz');
	});

	it('honours a lower precision', () => {
		expect(formatFrequency(433.92e6, 3)).toBe('434 MHz');
	});

	it('shows a dash for non-finite values', () => {
		expect(formatFrequency(Number.NaN)).toBe('—');
	});

	it('round-trips through parseFrequency', () => {
		for (const hz of [5.8e9, 433.92e6, 144.3e6, 27.12e6, 24.125e9]) {
			expect(hzOf(formatFrequency(hz))).toBe(hz);
		}
	});
});

describe('parseFrequencyParam', () => {
	const fallback = 2.45e9;

	it('uses the fallback without a message when the parameter is absent', () => {
		expect(parseFrequencyParam(null, fallback)).toEqual({ hz: fallback });
		expect(parseFrequencyParam('', fallback)).toEqual({ hz: fallback });
	});

	it('accepts plain Hz and text with a unit', () => {
		expect(parseFrequencyParam('5800000000', fallback)).toEqual({ hz: 5.8e9 });
		expect(parseFrequencyParam('5.8 GHz', fallback)).toEqual({ hz: 5.8e9 });
	});

	it('falls back with a message on a bad value', () => {
		const result = parseFrequencyParam('5.8 GHzz', fallback);
		expect(result.hz).toBe(fallback);
		expect(result.message).toMatch(/GHzz/);
		expect(result.message).toMatch(/2\.45 GHz/);
	});
});
