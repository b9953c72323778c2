/**
 * Printable build sheet (PDF): cut list, 1:1 cutting gauges and disc outlines, and calibration bars.
 * PDF user space is 1/72 in (ISO 32000-1 §8.3.2.3), so 1 mm = 72/25.4 pt. Every 1:1 shape sits in a
 * marked-content section (BwCalibration, BwGauge, BwCircle) so tests and tools can find it.
 */
import {
	PDFDocument,
	StandardFonts,
	appendBezierCurve,
	beginMarkedContent,
	closePath,
	endMarkedContent,
	fill,
	lineTo,
	moveTo,
	popGraphicsState,
	pushGraphicsState,
	rectangle,
	rgb,
	setLineWidth,
	stroke
} from 'pdf-lib';
import type { PDFFont, PDFOperator, PDFPage } from 'pdf-lib';
import { formatFrequency } from '$lib/rf/units/frequency';
import { formatMm } from '$lib/rf/units/length';
import { MM_PER_INCH } from '$lib/rf/units/constants';

export interface BuildSheetRow {
	key: string;
	label: string;
	kind: string;
	value_mm: number | null;
	display: string;
	unit: string;
	stock?: { name: string; value_mm: number };
	error?: string;
}

export interface BuildSheetInput {
	title: string;
	slug: string;
	revision: number;
	frequency_hz: number;
	units: 'mm' | 'in' | 'in_frac';
	generatedAt: Date;
	rows: BuildSheetRow[];
	cautions: string[];
	paper?: 'a4' | 'letter';
	demo?: boolean;
}

/** Thrown for input the route should never build (not for anything a user types). */
export class BuildSheetError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'BuildSheetError';
	}
}

const PAPER_SIZES = { a4: [595.28, 841.89], letter: [612, 792] } as const;
const CALIBRATION_TEXT = 'Print at 100 % (no fit-to-page). Check: this bar must measure 50.0 mm.';
const MARGIN = 36;
const FOOTER = 24;
/** Beyond this a length is split into so many parts that a rule is the better tool. */
const MAX_SPLIT_MM = 2000;
const KAPPA = 0.5522847498;

export function mmToPt(mm: number): number {
	return (mm * 72) / MM_PER_INCH;
}

// cp1252 (WinAnsiEncoding) code points above Latin-1's printable range, plus Latin-1 itself.
const WIN_ANSI_EXTRA = '€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ';
// prettier-ignore
const REPLACEMENTS: Record<string, string> = {
	λ: 'lambda', Λ: 'Lambda', Γ: 'Gamma', γ: 'gamma', ε: 'eps', π: 'pi', Ω: 'Ohm', ω: 'omega',
	Δ: 'Delta', δ: 'delta', α: 'alpha', β: 'beta', θ: 'theta', φ: 'phi', η: 'eta', σ: 'sigma',
	μ: 'µ', '≤': '<=', '≥': '>=', '≠': '!=', '≈': '~', '√': 'sqrt', '∞': 'inf', '′': "'",
	'″': '"', '−': '-', '‐': '-', '‑': '-', '‒': '-', '⌀': 'Ø', '→': '->', '←': '<-',
	'⅛': '1/8', '⅜': '3/8', '⅝': '5/8', '⅞': '7/8', '\u2009': ' ', '\u202f': ' ', '\u00a0': ' '
};

function isWinAnsi(ch: string): boolean {
	const cp = ch.codePointAt(0) ?? 0;
	return (cp >= 0x20 && cp <= 0x7e) || (cp >= 0xa0 && cp <= 0xff) || WIN_ANSI_EXTRA.includes(ch);
}

/** Makes text drawable with the standard Helvetica font (WinAnsi) so drawText cannot throw. */
export function toWinAnsi(text: string): string {
	let out = '';
	for (const ch of String(text ?? '').normalize('NFC')) {
		const swap = REPLACEMENTS[ch] ?? (/[\t\n\r]/.test(ch) ? ' ' : ch);
		if ([...swap].every(isWinAnsi)) out += swap;
		else {
			const base = ch.normalize('NFKD').replace(/\p{M}/gu, '');
			if (base && [...base].every(isWinAnsi)) out += base;
			else if (!/\p{C}/u.test(ch)) out += '?';
		}
	}
	return out;
}

const ANGLE_UNITS = ['deg', '°', 'rad', 'degree', 'degrees'];

export function isDiameterRow(row: Pick<BuildSheetRow, 'key' | 'label'>): boolean {
	// Whole key words only: "radial_len" and "feed_depth" are not diameters.
	return /(^|_)(d|dia|diam|diameter)(_|$)/.test(row.key) || /diameter|Ø|⌀/i.test(row.label);
}

export function isLengthRow(row: BuildSheetRow): boolean {
	return (
		!row.error &&
		row.kind !== 'count' &&
		!ANGLE_UNITS.includes(
			String(row.unit ?? '')
				.trim()
				.toLowerCase()
		) &&
		typeof row.value_mm === 'number' &&
		Number.isFinite(row.value_mm) &&
		row.value_mm > 0
	);
}

class Sheet {
	page!: PDFPage;
	y = 0;
	readonly pages: PDFPage[] = [];
	constructor(
		readonly doc: PDFDocument,
		readonly font: PDFFont,
		readonly bold: PDFFont,
		readonly size: readonly [number, number]
	) {
		this.newPage();
	}
	get width() {
		return this.size[0] - 2 * MARGIN;
	}
	newPage() {
		this.page = this.doc.addPage([this.size[0], this.size[1]]);
		this.pages.push(this.page);
		this.y = this.size[1] - MARGIN;
	}
	/** Starts a new page unless `height` points still fit above the footer. */
	room(height: number) {
		if (this.y - height < MARGIN + FOOTER) this.newPage();
	}
	wrap(text: string, size: number, width: number, font = this.font): string[] {
		const lines: string[] = [];
		let line = '';
		for (const word of toWinAnsi(text).split(' ')) {
			const next = line ? `${line} ${word}` : word;
			if (font.widthOfTextAtSize(next, size) <= width || !line) line = next;
			else {
				lines.push(line);
				line = word;
			}
		}
		lines.push(line);
		return lines;
	}
	text(text: string, x: number, y: number, size = 9, font = this.font) {
		this.page.drawText(toWinAnsi(text), { x, y, size, font, color: rgb(0, 0, 0) });
	}
	paragraph(text: string, size = 9, font = this.font, indent = 0) {
		for (const line of this.wrap(text, size, this.width - indent, font)) {
			this.room(size + 3);
			this.y -= size + 3;
			this.text(line, MARGIN + indent, this.y, size, font);
		}
	}
	shape(tag: string, ops: PDFOperator[]) {
		this.page.pushOperators(
			beginMarkedContent(tag),
			pushGraphicsState(),
			...ops,
			popGraphicsState(),
			endMarkedContent()
		);
	}
	/** A bar of exactly `lengthPt` with end ticks 3 mm past each side; `ticksPt` adds minor ticks. */
	bar(tag: string, x: number, y: number, lengthPt: number, ticksPt = 0) {
		const tick = mmToPt(3);
		const ops = [rectangle(x, y, lengthPt, 2), fill(), setLineWidth(0.4)];
		ops.push(moveTo(x, y - tick), lineTo(x, y + 2 + tick), moveTo(x + lengthPt, y - tick));
		ops.push(lineTo(x + lengthPt, y + 2 + tick));
		for (let t = ticksPt; ticksPt > 0 && t < lengthPt - 0.01; t += ticksPt) {
			ops.push(moveTo(x + t, y + 2), lineTo(x + t, y + 2 + tick / 2));
		}
		ops.push(stroke());
		this.shape(tag, ops);
	}
	circle(cx: number, cy: number, r: number) {
		const k = KAPPA * r;
		const arm = r + mmToPt(3);
		this.shape('BwCircle', [
			setLineWidth(0.4),
			moveTo(cx + r, cy),
			appendBezierCurve(cx + r, cy + k, cx + k, cy + r, cx, cy + r),
			appendBezierCurve(cx - k, cy + r, cx - r, cy + k, cx - r, cy),
			appendBezierCurve(cx - r, cy - k, cx - k, cy - r, cx, cy - r),
			appendBezierCurve(cx + k, cy - r, cx + r, cy - k, cx + r, cy),
			closePath(),
			moveTo(cx - arm, cy),
			lineTo(cx + arm, cy),
			moveTo(cx, cy - arm),
			lineTo(cx, cy + arm),
			stroke()
		]);
	}
}

function check(input: BuildSheetInput) {
	if (!input || typeof input.title !== 'string') throw new BuildSheetError('title is required');
	if (!Number.isInteger(input.revision) || input.revision < 1) {
		throw new BuildSheetError('revision must be a whole number from 1');
	}
	if (!Number.isFinite(input.frequency_hz) || input.frequency_hz <= 0) {
		throw new BuildSheetError('frequency_hz must be a positive number');
	}
	if (!(input.generatedAt instanceof Date) || Number.isNaN(input.generatedAt.getTime())) {
		throw new BuildSheetError('generatedAt must be a valid date');
	}
	if (!Array.isArray(input.cautions)) throw new BuildSheetError('cautions must be a list');
	if (!Array.isArray(input.rows) || input.rows.length > 500) {
		throw new BuildSheetError('rows must be a list of at most 500');
	}
	if (input.paper && !(input.paper in PAPER_SIZES))
		throw new BuildSheetError('paper must be a4 or letter');
}

function header(s: Sheet, input: BuildSheetInput) {
	s.paragraph(input.title, 16, s.bold);
	s.paragraph(`Revision r${input.revision} · ${input.slug}`, 10);
	s.paragraph(`Target frequency: ${formatFrequency(input.frequency_hz)}`, 10, s.bold);
	const units = { mm: 'millimetres', in: 'inches', in_frac: 'fractional inches (1/64)' }[
		input.units
	];
	s.paragraph(
		`Units: ${units ?? input.units}. Generated ${input.generatedAt.toISOString().slice(0, 16)} UTC.`,
		8
	);
	if (input.demo)
		s.paragraph('Demo data: invented for demonstration, not a tested design.', 10, s.bold);
}

function calibration(s: Sheet) {
	s.y -= 6;
	s.paragraph(CALIBRATION_TEXT, 10, s.bold);
	s.room(40);
	s.y -= 20;
	s.bar('BwCalibration', MARGIN, s.y, mmToPt(50), mmToPt(10));
	s.text('50 mm', MARGIN + mmToPt(50) + 14, s.y - 2, 9);
	s.y -= 22;
	s.bar('BwCalibration', MARGIN, s.y, 2 * 72, 36);
	s.text('2 in (must measure 2.00 in)', MARGIN + 2 * 72 + 14, s.y - 2, 9);
	s.y -= 12;
}

const COLUMNS: [string, number][] = [
	['Dimension', 0.34],
	['Kind', 0.12],
	['Value', 0.18],
	['Stock', 0.18],
	['Note', 0.18]
];

function cutList(s: Sheet, rows: BuildSheetRow[]) {
	s.y -= 8;
	s.paragraph('Cut list', 12, s.bold);
	const cells = (row: BuildSheetRow | null): string[] =>
		row
			? [
					`${row.label} (${row.key})`,
					row.kind,
					row.error ? '-' : `${row.display} ${row.unit}`.trim(),
					row.stock ? `${row.stock.name} (${formatMm(row.stock.value_mm)})` : '',
					row.error ?? ''
				]
			: COLUMNS.map(([name]) => name);
	for (const row of [null, ...rows]) {
		const font = row ? s.font : s.bold;
		const wrapped = cells(row).map((c, i) => s.wrap(c, 8, COLUMNS[i][1] * s.width - 4, font));
		const height = Math.max(...wrapped.map((w) => w.length)) * 10 + 4;
		s.room(height);
		let x = MARGIN;
		wrapped.forEach((lines, i) => {
			lines.forEach((line, j) => s.text(line, x, s.y - 10 - j * 10, 8, font));
			x += COLUMNS[i][1] * s.width;
		});
		s.y -= height;
		s.page.drawLine({
			start: { x: MARGIN, y: s.y + 2 },
			end: { x: MARGIN + s.width, y: s.y + 2 },
			thickness: 0.3,
			color: rgb(0.6, 0.6, 0.6)
		});
	}
}

function gauges(s: Sheet, rows: BuildSheetRow[], units: BuildSheetInput['units']) {
	const maxPt = s.width - mmToPt(6);
	for (const row of rows) {
		const valueMm = row.value_mm as number;
		const inUnits = units === 'mm' ? '' : ` (${row.display} ${row.unit})`;
		const label = `${row.label} (${row.key}): ${formatMm(valueMm)}${inUnits}`;
		const lengthPt = mmToPt(valueMm);
		const parts = Math.ceil(lengthPt / maxPt);
		if (valueMm > MAX_SPLIT_MM) {
			s.paragraph(`${label}: too long to draw 1:1, measure with a rule.`, 9);
			continue;
		}
		const note =
			parts > 1
				? ` - longer than the page: ${parts} equal parts of ${formatMm(valueMm / parts)}, join end to end`
				: '';
		s.room(16 + parts * 28);
		s.paragraph(label + note, 9);
		for (let i = 0; i < parts; i++) {
			s.y -= 22;
			s.bar('BwGauge', MARGIN + mmToPt(3), s.y, lengthPt / parts);
			if (parts > 1) s.text(`part ${i + 1} of ${parts}`, MARGIN + mmToPt(3) + 4, s.y + 5, 7);
		}
		s.y -= 12;
	}
}

function circles(s: Sheet, rows: BuildSheetRow[]) {
	for (const row of rows) {
		const d = row.value_mm as number;
		const r = mmToPt(d) / 2;
		const label = `Ø ${formatMm(d)} - ${row.label} (${row.key}); the cross marks the centre`;
		const pageRoom = s.size[1] - 2 * MARGIN - FOOTER - 40;
		if (2 * r + mmToPt(6) > Math.min(s.width, pageRoom)) {
			s.paragraph(`${label}: too large to draw 1:1, mark it with a compass or a string.`, 9);
			continue;
		}
		s.room(2 * r + mmToPt(6) + 20);
		s.paragraph(label, 9);
		const arm = r + mmToPt(3);
		s.y -= arm + 4;
		s.circle(MARGIN + arm, s.y, r);
		s.y -= arm + 8;
	}
}

export async function renderBuildSheet(input: BuildSheetInput): Promise<Uint8Array> {
	check(input);
	const doc = await PDFDocument.create();
	doc.setTitle(`${input.title} r${input.revision} build sheet`);
	doc.setProducer('Bandwright');
	doc.setCreator('Bandwright');
	doc.setCreationDate(input.generatedAt);
	doc.setModificationDate(input.generatedAt);
	const font = await doc.embedFont(StandardFonts.Helvetica);
	const bold = await doc.embedFont(StandardFonts.HelveticaBold);
	const s = new Sheet(doc, font, bold, PAPER_SIZES[input.paper ?? 'a4']);

	header(s, input);
	calibration(s);
	cutList(s, input.rows);
	if (input.cautions.length) {
		s.y -= 8;
		s.paragraph('Cautions', 12, s.bold);
		for (const caution of input.cautions) s.paragraph(`- ${caution}`, 8, s.font, 6);
	}
	const drawable = input.rows.filter(isLengthRow);
	s.y -= 8;
	s.paragraph('1:1 drawings (check the calibration bar first)', 12, s.bold);
	gauges(
		s,
		drawable.filter((r) => !isDiameterRow(r)),
		input.units
	);
	circles(s, drawable.filter(isDiameterRow));

	const footer = `Bandwright build sheet · ${input.title} · r${input.revision}${input.demo ? ' · Demo data' : ''}`;
	s.pages.forEach((page, i) => {
		const text = toWinAnsi(`${footer} · page ${i + 1} of ${s.pages.length}`);
		page.drawText(text, { x: MARGIN, y: MARGIN - 12, size: 7, font, color: rgb(0.3, 0.3, 0.3) });
	});
	return doc.save({ useObjectStreams: false });
}
