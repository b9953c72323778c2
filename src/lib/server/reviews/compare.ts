/** The diff of any two revisions of one design: notes, dimension table, parameters, claim, sweeps. */
import { desc, eq } from 'drizzle-orm';
import { db } from '../db';
import { measurements, type Design, type Revision } from '../db/schema';
import {
	diffNotes,
	sideBySide,
	type NotesDiffPart,
	type SideBySideRow
} from '$lib/rf/tables/notes-diff';
import {
	diffTables,
	type DiffParameter,
	type TableDiff,
	type TableSide
} from '$lib/rf/tables/table-diff';
import type { TableResult } from '$lib/rf/tables/types';
import { parseFrequency } from '$lib/rf/units/frequency';
import { contentOf } from '../designs/content';
import { listRevisions } from '../designs/lookups';
import { canRead, getRevision } from '../designs/lookups';
import { computeRevision } from '../designs/dimensions';
import { DomainError } from '../http/errors';
import type { SessionUser } from '../accounts/auth';

export interface SweepSummary {
	measurementId: string;
	createdAt: string;
	f_min_vswr_hz: number | null;
	band_vswr_2: [number, number] | null;
}

export interface MeasurementShift {
	from: SweepSummary | null;
	to: SweepSummary | null;
	shift_min_hz: number | null;
	shift_band_lo_hz: number | null;
	shift_band_hi_hz: number | null;
	message: string;
}

export interface RevisionDiff {
	from: number;
	to: number;
	same: boolean;
	frequency_hz: number;
	notes: NotesDiffPart[];
	notesSideBySide: SideBySideRow[];
	rows: TableDiff['rows'];
	parameters: TableDiff['parameters'];
	claims: TableDiff['claims'];
	summary: TableDiff['summary'];
	measurements: MeasurementShift;
}

const num = (x: unknown): number | null => (typeof x === 'number' && Number.isFinite(x) ? x : null);

/** The VSWR ≤ 2 band holding the minimum, else the widest: the band a builder means by "the" band. */
export function mainBand(bands: unknown, fMin: number | null): [number, number] | null {
	if (!Array.isArray(bands)) return null;
	const valid = bands.filter(
		(b): b is [number, number] =>
			Array.isArray(b) && num(b[0]) !== null && num(b[1]) !== null && b[0] <= b[1]
	);
	if (valid.length === 0) return null;
	const holding = fMin === null ? undefined : valid.find(([lo, hi]) => fMin >= lo && fMin <= hi);
	return holding ?? [...valid].sort((a, b) => b[1] - b[0] - (a[1] - a[0]))[0];
}

/** Reads the stored AnalyzeResult defensively: it comes from another module's uploads. */
function summarizeSweep(row: {
	id: string;
	createdAt: Date;
	analysis: Record<string, unknown>;
}): SweepSummary {
	const fMin = num(row.analysis?.f_min_vswr_hz);
	return {
		measurementId: row.id,
		createdAt: row.createdAt.toISOString(),
		f_min_vswr_hz: fMin,
		band_vswr_2: mainBand(row.analysis?.bands_vswr_2, fMin)
	};
}

function newestSweep(revisionId: string): SweepSummary | null {
	const row = db
		.select({
			id: measurements.id,
			createdAt: measurements.createdAt,
			analysis: measurements.analysis
		})
		.from(measurements)
		.where(eq(measurements.revisionId, revisionId))
		.orderBy(desc(measurements.createdAt))
		.get();
	return row ? summarizeSweep(row) : null;
}

export function measurementShift(
	from: SweepSummary | null,
	to: SweepSummary | null
): MeasurementShift {
	const d = (a: number | null | undefined, b: number | null | undefined) =>
		a === null || a === undefined || b === null || b === undefined ? null : b - a;
	const base = { from, to, shift_min_hz: null, shift_band_lo_hz: null, shift_band_hi_hz: null };
	if (!from && !to) return { ...base, message: 'no sweeps' };
	if (!from || !to)
		return { ...base, message: `no sweeps for the ${from ? 'newer' : 'older'} revision` };
	return {
		from,
		to,
		shift_min_hz: d(from.f_min_vswr_hz, to.f_min_vswr_hz),
		shift_band_lo_hz: d(from.band_vswr_2?.[0], to.band_vswr_2?.[0]),
		shift_band_hi_hz: d(from.band_vswr_2?.[1], to.band_vswr_2?.[1]),
		message:
			from.band_vswr_2 && to.band_vswr_2
				? 'newest sweeps compared'
				: 'a sweep never reaches VSWR ≤ 2'
	};
}

function sideOf(r: Revision): TableSide {
	const c = contentOf(r);
	const design: DiffParameter = {
		key: 'design_frequency',
		label: 'Design frequency',
		value: c.design_frequency_hz,
		unit: 'Hz'
	};
	return { parameters: [design, ...c.parameters], rows: c.rows, claim: c.claim };
}

/** Exact lengths in mm of rows that computed; counts and errors give no value. */
function valuesOf(result: TableResult): Record<string, number | null> {
	return Object.fromEntries(
		result.rows.map((row) => [
			row.key,
			row.error || row.value_mm === undefined ? null : row.value_mm
		])
	);
}

export function compareRevisions(from: Revision, to: Revision, frequencyHz: number): RevisionDiff {
	if (from.designId !== to.designId)
		throw new DomainError(404, 'Both revisions must belong to the same design.');
	const table = diffTables(sideOf(from), sideOf(to), {
		valuesFrom: valuesOf(computeRevision(from, { frequencyHz })),
		valuesTo: valuesOf(computeRevision(to, { frequencyHz }))
	});
	const notes = diffNotes(from.notes, to.notes);
	return {
		from: from.number,
		to: to.number,
		same: from.id === to.id,
		frequency_hz: frequencyHz,
		notes,
		notesSideBySide: sideBySide(notes),
		rows: table.rows,
		parameters: table.parameters,
		claims: table.claims,
		summary: table.summary,
		measurements: measurementShift(newestSweep(from.id), newestSweep(to.id))
	};
}

/** Revisions a reader may see, newest first. */
export function readableRevisions(design: Design, user: SessionUser | null) {
	return listRevisions(design.id).filter((h) => h.state !== 'draft' || h.authorId === user?.id);
}

function pick(
	design: Design,
	text: string,
	name: 'from' | 'to',
	user: SessionUser | null
): Revision {
	if (!/^\d{1,6}$/.test(text))
		throw new DomainError(400, `${name} must be a revision number such as 2.`, name);
	const r = getRevision(design.id, Number(text));
	// A draft someone else owns is hidden like a missing one.
	if (!r || !canRead(user, r))
		throw new DomainError(404, `This design has no revision r${text}.`, name);
	return r;
}

/**
 * The two revisions and the frequency a compare URL asks for. Without `to`: the newest readable
 * revision; without `from`: the one before `to`. A bad `f` throws only when `strictFrequency`.
 */
export function resolveCompare(
	design: Design,
	query: { from: string | null; to: string | null; f: string | null },
	user: SessionUser | null,
	strictFrequency = true
) {
	const list = readableRevisions(design, user);
	if (list.length === 0) throw new DomainError(404, 'This design has no revisions you can read.');
	const to = query.to
		? pick(design, query.to, 'to', user)
		: getRevision(design.id, list[0].number)!;
	const before = list.find((h) => h.number < to.number);
	const from = query.from
		? pick(design, query.from, 'from', user)
		: getRevision(design.id, (before ?? list.find((h) => h.number === to.number)!).number)!;
	let hz = to.designHz;
	let frequencyMessage: string | null = null;
	if (query.f !== null && query.f.trim() !== '') {
		const parsed = parseFrequency(query.f);
		if (parsed.ok) hz = parsed.hz;
		else if (strictFrequency) throw new DomainError(400, parsed.message, 'f');
		else frequencyMessage = `Frequency ignored: ${parsed.message}`;
	}
	return {
		from,
		to,
		hz,
		frequencyMessage,
		revisions: list.map((h) => ({ number: h.number, state: h.state }))
	};
}
