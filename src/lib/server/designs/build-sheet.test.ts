import { describe, expect, it } from 'vitest';
import { PDFDocument, StandardFonts } from 'pdf-lib';
import { decodeHex, operators, shownText, type Op } from '../../testing/pdf-text';
import {
	BuildSheetError,
	isDiameterRow,
	isLengthRow,
	mmToPt,
	renderBuildSheet,
	toWinAnsi
} from './build-sheet';
import type { BuildSheetInput, BuildSheetRow } from './build-sheet';

// PDF user space: 1 unit = 1/72 in (ISO 32000-1:2008 §8.3.2.3); 1 in = 25.4 mm exactly
// (international yard and pound agreement, 1959). [calc] pt = mm x 72 / 25.4.
const PT_50MM = 141.73; // [calc] 50 x 72 / 25.4 = 141.732
const PT_2IN = 144; // [calc] 2 x 72
const PT_30_59MM = 86.71; // [calc] 30.59 x 72 / 25.4 = 86.712

const rectWidths = (ops: Op[], tag: string) =>
	ops.filter((o) => o.op === 're' && o.tag === `/${tag}`).map((o) => Number(o.args[2]));

const row = (
	key: string,
	label: string,
	value_mm: number | null,
	extra: Partial<BuildSheetRow> = {}
): BuildSheetRow => ({
	key,
	label,
	kind: 'resonant',
	value_mm,
	display: value_mm === null ? '' : value_mm.toFixed(2),
	unit: 'mm',
	...extra
});

// Fixture rows are invented test input; only the pt conversions above are check values.
const input = (extra: Partial<BuildSheetInput> = {}): BuildSheetInput => ({
	title: 'Test dipole – λ/4 arms ≤ 31 mm',
	slug: 'test-dipole',
	revision: 3,
	frequency_hz: 2.45e9,
	units: 'mm',
	generatedAt: new Date('2025-01-02T03:04:05Z'),
	rows: [
		row('arm', 'Quarter-wave arm', 30.59),
		row('disc_dia', 'Reflector disc', 25, { kind: 'structural' }),
		row('wire_d', 'Wire', 1.628, { kind: 'material', stock: { name: 'AWG 14', value_mm: 1.628 } }),
		row('turns', 'Turns', 5, { kind: 'count', unit: '' }),
		row('bad', 'Broken row', null, { error: 'Unknown name "lamda" at column 1' })
	],
	cautions: ['Keep people away from a transmitting antenna (RF exposure, ICNIRP 2020).'],
	...extra
});

async function render(extra: Partial<BuildSheetInput> = {}) {
	const doc = await PDFDocument.load(await renderBuildSheet(input(extra)));
	return { doc, ops: doc.getPages().flatMap(operators) };
}

describe('mmToPt', () => {
	it('converts with 72 pt per 25.4 mm', () => {
		expect(mmToPt(50)).toBeCloseTo(PT_50MM, 2);
		expect(mmToPt(25.4)).toBe(72);
	});
});

describe('renderBuildSheet', () => {
	it('makes an A4 page by default and a Letter page on request', async () => {
		const { doc } = await render();
		// ISO 216 A4 = 210 x 297 mm = 595.28 x 841.89 pt [calc]
		expect(doc.getPage(0).getSize()).toEqual({ width: 595.28, height: 841.89 });
		const letter = await render({ paper: 'letter' });
		// US Letter 8.5 x 11 in = 612 x 792 pt [calc]
		expect(letter.doc.getPage(0).getSize()).toEqual({ width: 612, height: 792 });
	});

	it('draws the 50 mm and 2 in calibration bars at 1:1', async () => {
		const { ops } = await render();
		const widths = rectWidths(ops, 'BwCalibration');
		expect(widths).toHaveLength(2);
		expect(widths[0]).toBeCloseTo(PT_50MM, 2);
		expect(widths[1]).toBeCloseTo(PT_2IN, 2);
		expect(shownText(ops)).toContain(
			'Print at 100 % (no fit-to-page). Check: this bar must measure 50.0 mm.'
		);
	});

	it('draws a 30.59 mm gauge as 86.71 pt and skips counts, errors and diameters', async () => {
		const { ops } = await render();
		const widths = rectWidths(ops, 'BwGauge');
		expect(widths).toHaveLength(1);
		expect(widths[0]).toBeCloseTo(PT_30_59MM, 2);
	});

	it('draws each diameter as a circle of that diameter with a centre cross', async () => {
		const { ops } = await render();
		const circle = ops.filter((o) => o.tag === '/BwCircle');
		const curveX = circle.filter((o) => o.op === 'c').map((o) => Number(o.args[4]));
		const centreX = (Math.max(...curveX) + Math.min(...curveX)) / 2;
		const diameters = [];
		for (let i = 0; i < curveX.length; i += 4) {
			const xs = curveX.slice(i, i + 4);
			diameters.push(Math.max(...xs) - Math.min(...xs));
		}
		// Two circles: the 25 mm disc and the 1.628 mm wire (key "wire_d"). [calc] 25 mm = 70.866 pt
		expect(diameters.map((d) => d.toFixed(2))).toEqual([
			mmToPt(25).toFixed(2),
			mmToPt(1.628).toFixed(2)
		]);
		const lines = circle.filter((o) => o.op === 'l').map((o) => o.args.map(Number));
		expect(lines.some(([x]) => Math.abs(x - centreX) < 0.01)).toBe(true);
	});

	it('lists every row in the cut list with its stock and errors, plus cautions and demo mark', async () => {
		const { ops } = await render({ demo: true });
		const text = shownText(ops);
		for (const part of [
			'Quarter-wave arm (arm)',
			'30.59 mm',
			'AWG 14 (1.63 mm)',
			'Turns (turns)',
			'lamda'
		]) {
			expect(text).toContain(part);
		}
		expect(text).toContain('Target frequency: 2.45 GHz');
		expect(text).toContain('Revision r3');
		expect(text).toContain('Keep people away');
		expect(text).toMatch(/Demo data/);
		expect(text).toContain('lambda/4 arms <= 31 mm');
	});

	it('splits a length longer than the page into equal 1:1 parts', async () => {
		const { ops } = await render({ rows: [row('boom', 'Boom', 400)] });
		const widths = rectWidths(ops, 'BwGauge');
		expect(widths.length).toBeGreaterThan(1);
		expect(widths.reduce((a, b) => a + b, 0)).toBeCloseTo(mmToPt(400), 1);
		expect(new Set(widths.map((w) => w.toFixed(3))).size).toBe(1);
		expect(shownText(ops)).toMatch(/join end to end/);
	});

	it('does not draw a very long length, and says to use a rule', async () => {
		const { ops } = await render({ rows: [row('mast', 'Mast', 2500)] });
		expect(rectWidths(ops, 'BwGauge')).toEqual([]);
		expect(shownText(ops)).toMatch(/too long to draw 1:1, measure with a rule/);
	});

	it('runs onto more pages for long tables and numbers them', async () => {
		const rows = Array.from({ length: 80 }, (_, i) => row(`r${i}`, `Element ${i}`, 20 + i));
		const { doc, ops } = await render({ rows });
		expect(doc.getPageCount()).toBeGreaterThan(2);
		expect(shownText(ops)).toContain(`page 1 of ${doc.getPageCount()}`);
		expect(rectWidths(ops, 'BwGauge')).toHaveLength(80);
	});

	it('keeps all text inside the page, even long labels and cautions', async () => {
		const long = 'Driven element with a long descriptive label that has to wrap inside its cell';
		const bytes = await renderBuildSheet(
			input({
				rows: [row('arm', long, 30.59, { display: '1 13/64', unit: 'in' }), row('boom', long, 700)],
				units: 'in_frac',
				cautions: ['Solder fumes: ventilate the room. '.repeat(10)]
			})
		);
		const doc = await PDFDocument.load(bytes);
		const font = await doc.embedFont(StandardFonts.Helvetica);
		let checked = 0;
		for (const page of doc.getPages()) {
			const { width, height } = page.getSize();
			let x = 0;
			let y = 0;
			let size = 0;
			for (const o of operators(page)) {
				if (o.op === 'Tf') size = Number(o.args[1]);
				if (o.op === 'Tm') [x, y] = [Number(o.args[4]), Number(o.args[5])];
				if (o.op !== 'Tj') continue;
				const text = decodeHex(o.args[0]);
				// Bold text is a little wider than regular; 2 % covers it for these strings.
				expect(x + font.widthOfTextAtSize(text, size) * 1.02, text).toBeLessThanOrEqual(width - 18);
				expect(x).toBeGreaterThanOrEqual(18);
				expect(y).toBeGreaterThanOrEqual(18);
				expect(y).toBeLessThanOrEqual(height - 18);
				checked++;
			}
		}
		expect(checked).toBeGreaterThan(20);
	});

	it('rejects input the route should never send', async () => {
		await expect(renderBuildSheet(input({ revision: 0 }))).rejects.toThrow(BuildSheetError);
		await expect(renderBuildSheet(input({ frequency_hz: Number.NaN }))).rejects.toThrow(
			/frequency/
		);
	});
});

describe('helpers', () => {
	it('toWinAnsi leaves only characters Helvetica can encode', async () => {
		const doc = await PDFDocument.create();
		const font = await doc.embedFont(StandardFonts.Helvetica);
		const charset = new Set(font.getCharacterSet());
		const out = toWinAnsi('λ/4 ≤ Γ – “x” ‘y’ Ø 3.2 mm ± 0.1 µm, εr √2 ≈ 1.41 ő 漢\u0007');
		expect([...out].every((ch) => charset.has(ch.codePointAt(0) ?? -1))).toBe(true);
		expect(out).toBe('lambda/4 <= Gamma – “x” ‘y’ Ø 3.2 mm ± 0.1 µm, epsr sqrt2 ~ 1.41 o ?');
		expect(() => font.encodeText(out)).not.toThrow();
	});

	it('recognises diameter rows by whole key words or the label', () => {
		const is = (key: string, label = 'x') => isDiameterRow({ key, label });
		expect([is('wire_d'), is('disc_dia'), is('reflector_diam'), is('d')]).toEqual([
			true,
			true,
			true,
			true
		]);
		expect([is('feed_depth'), is('radial_len'), is('side')]).toEqual([false, false, false]);
		expect([is('disc', 'Disc diameter'), is('hole', 'Ø hole')]).toEqual([true, true]);
	});

	it('treats angles, counts and errors as not drawable', () => {
		expect(isLengthRow(row('a', 'A', 10))).toBe(true);
		expect(isLengthRow(row('a', 'A', 10, { unit: 'deg' }))).toBe(false);
		expect(isLengthRow(row('a', 'A', 10, { kind: 'count' }))).toBe(false);
		expect(isLengthRow(row('a', 'A', 10, { error: 'x' }))).toBe(false);
		expect(isLengthRow(row('a', 'A', 0))).toBe(false);
	});
});
