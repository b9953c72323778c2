/** Sweeps on revisions: the author's measurements and other members' build reports. */
import { asc, eq, getTableColumns, sql } from 'drizzle-orm';
import { parseSweep, type AnalyzeQuery } from '$lib/rf/sweeps/sweep';
import { analyzeSweep, type AnalyzeOptions, type AnalyzeResult } from '$lib/rf/sweeps/claim-check';
import type { Sweep } from '$lib/rf/sweeps/types';
import { buildReportSchema, firstIssue, measurementFormSchema } from '$lib/schemas/measurement';
import { formatFrequency } from '$lib/rf/units/frequency';
import { db } from '../db';
import { measurements, users, type Revision } from '../db/schema';
import type { SessionUser } from '../accounts/auth';
import { newId } from '../accounts/accounts';
import { audit } from '../moderation/audit';
import { contentOf } from '../designs/content';
import { blobStore } from '../storage/from-env';
import { newBlobKey } from '../storage/blob';
import { sniff } from './sniff';
import {
	assertUploadAccess,
	safeFileName,
	tooLarge,
	UploadError,
	type UploadKind
} from './uploads';

export const MAX_SWEEP_BYTES = 10 * 1024 * 1024;
const SWEEP_CONTENT_TYPE = 'text/plain; charset=utf-8';

/** The sweep's text, or an UploadError saying what the bytes are instead. */
function sweepText(bytes: Uint8Array): string {
	if (bytes.byteLength > MAX_SWEEP_BYTES)
		throw tooLarge(bytes.byteLength, MAX_SWEEP_BYTES, 'a sweep');
	const kind = sniff(bytes);
	if (kind.kind === 'image') {
		throw new UploadError(
			415,
			`This is an image (${kind.label}), not a sweep: upload a Touchstone .s1p or a CSV file; pictures go under Photos.`,
			'file'
		);
	}
	if (kind.kind === 'archive' || kind.kind === 'document') {
		throw new UploadError(
			415,
			`This is ${kind.label}, not a sweep: upload a Touchstone .s1p or a CSV file.`,
			'file'
		);
	}
	// Non-UTF-8 bytes decode to U+FFFD, which parseSweep reports with its line and column.
	return new TextDecoder('utf-8').decode(bytes);
}

/** Parses bytes as a sweep with the query's options; failures are located UploadErrors (422, or 400 for a bad option). */
function parseSweepBytes(
	bytes: Uint8Array,
	q: Omit<AnalyzeQuery, 'design_hz' | 'band_lo_hz' | 'band_hi_hz' | 'vswr_max'>
): Sweep {
	const text = sweepText(bytes);
	const parsed = parseSweep(text, {
		format: q.format,
		z0: q.z0,
		column: q.column,
		quantity: q.quantity,
		freq_unit: q.freq_unit,
		parameter: q.parameter
	});
	if (!parsed.ok) {
		const e = parsed.error;
		const status = e.code === 'bad_argument' ? 400 : 422;
		const message =
			e.code === 'ambiguous' || e.code === 'bad_argument' ? e.message : capitalize(e.message);
		throw new UploadError(
			status,
			message,
			e.field ?? (status === 422 ? 'file' : undefined),
			e.line,
			e.column
		);
	}
	return parsed.sweep;
}

const capitalize = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** POST /api/v1/sweeps/analyze: parse and analyze, store nothing. */
export function analyzeBytes(bytes: Uint8Array, q: AnalyzeQuery): AnalyzeResult {
	const sweep = parseSweepBytes(bytes, q);
	const options: AnalyzeOptions = { design_hz: q.design_hz };
	if (q.band_lo_hz !== undefined && q.band_hi_hz !== undefined) {
		options.band_lo_hz = q.band_lo_hz;
		options.band_hi_hz = q.band_hi_hz;
		options.vswr_max = q.vswr_max;
	}
	return analyzeSweep(sweep, options);
}

const sweepExtension = (s: Sweep) => (s.source === 'csv' ? 'csv' : s.ports === 2 ? 's2p' : 's1p');

interface ClaimUsed {
	band_lo_hz: number;
	band_hi_hz: number;
	vswr_max: number;
	/** The claim was moved to a build report's target frequency (same fractional band). */
	scaled: boolean;
}

/** The revision's claim, moved proportionally to the target frequency of a build at another band. */
function claimFor(r: Revision, targetHz: number | null): ClaimUsed & { design_hz: number } {
	const claim = contentOf(r).claim;
	const k = targetHz && targetHz !== r.designHz ? targetHz / r.designHz : 1;
	return {
		band_lo_hz: claim.band_lo_hz * k,
		band_hi_hz: claim.band_hi_hz * k,
		vswr_max: claim.vswr_max,
		scaled: k !== 1,
		design_hz: r.designHz * k
	};
}

export interface StoredAnalysis extends AnalyzeResult {
	design_hz: number;
	claim_used: ClaimUsed;
}

export interface NewMeasurement {
	fields: Record<string, string>;
	file: { bytes: Uint8Array; name: string };
}

function validate(kind: UploadKind, fields: Record<string, string>) {
	const base = measurementFormSchema.safeParse(fields);
	if (!base.success) {
		const i = firstIssue(base.error);
		throw new UploadError(400, capitalize(i.message), i.field);
	}
	if (kind === 'measurement') return { form: base.data, build: null };
	const build = buildReportSchema.safeParse(fields);
	if (!build.success) {
		const i = firstIssue(build.error);
		throw new UploadError(400, capitalize(i.message), i.field);
	}
	return { form: base.data, build: build.data };
}

/**
 * Stores a sweep on a revision: checks access, fields and file first, then the blob, then the row
 * (with its audit entry) in one transaction; a failed insert removes the blob again.
 * @throws UploadError for anything the uploader can fix; nothing is stored then.
 */
export async function addMeasurement(
	user: SessionUser,
	r: Revision,
	input: NewMeasurement,
	options: { isDemo?: boolean; now?: Date } = {}
): Promise<{ id: string; kind: UploadKind; claimPass: boolean | null }> {
	const kind = assertUploadAccess(user, r);
	const { form, build } = validate(kind, input.fields);
	if (input.file.bytes.byteLength === 0) throw new UploadError(422, 'The file is empty.', 'file');
	const sweep = parseSweepBytes(input.file.bytes, form);
	const claim = claimFor(r, build?.target_frequency ?? null);
	const { design_hz, ...claimUsed } = claim;
	const result = analyzeSweep(sweep, { design_hz, ...claimUsed });
	const analysis: StoredAnalysis = { ...result, design_hz, claim_used: claimUsed };
	const id = newId();
	const key = newBlobKey('sweeps', options.now);
	const store = blobStore();
	await store.put(key, input.file.bytes, SWEEP_CONTENT_TYPE);
	try {
		db.transaction((tx) => {
			tx.insert(measurements)
				.values({
					id,
					revisionId: r.id,
					uploaderId: user.id,
					kind,
					instrument: form.instrument,
					referencePlane: form.reference_plane,
					measuredOn: form.measured_on,
					notes: form.notes,
					targetHz: build?.target_frequency ?? null,
					deviations: build?.deviations ?? '',
					materials: build?.materials ?? '',
					fileKey: key,
					fileName: safeFileName(input.file.name, sweepExtension(sweep), 'sweep'),
					fileType: SWEEP_CONTENT_TYPE,
					fileSize: input.file.bytes.byteLength,
					analysis: analysis as unknown as Record<string, unknown>,
					claimPass: result.claim?.pass ?? null,
					isDemo: options.isDemo ?? false,
					...(options.now ? { createdAt: options.now } : {})
				})
				.run();
			audit(
				{
					actorId: user.id,
					action: kind === 'measurement' ? 'measurement.add' : 'build_report.add',
					targetType: 'measurement',
					targetId: id,
					details: { revisionId: r.id, number: r.number, pass: result.claim?.pass ?? null }
				},
				tx
			);
		});
	} catch (e) {
		await store.delete(key).catch(() => undefined);
		throw e;
	}
	return { id, kind, claimPass: result.claim?.pass ?? null };
}

export function getMeasurement(id: string) {
	if (!/^[a-z2-7]{24}$/.test(id)) return null;
	return db.select().from(measurements).where(eq(measurements.id, id)).get() ?? null;
}

export type MeasurementRow = NonNullable<ReturnType<typeof getMeasurement>>;

// The design page lists metrics only: the stored series (about 34 kB of JSON a sweep) stays in
// the database; `metrics` is the analysis without it (kept by a trigger, drizzle/0003).
const { analysis: _analysis, metrics, ...listedColumns } = getTableColumns(measurements);
const measurementsOfRevision = db
	.select({
		m: {
			...listedColumns,
			analysis: sql<Record<string, unknown>>`${metrics}`.mapWith(
				(v: string) => JSON.parse(v) as Record<string, unknown>
			)
		},
		uploader: users.displayName
	})
	.from(measurements)
	.innerJoin(users, eq(users.id, measurements.uploaderId))
	.where(eq(measurements.revisionId, sql.placeholder('revisionId')))
	.orderBy(asc(measurements.createdAt), asc(measurements.id))
	.prepare();

/** A revision's sweeps, oldest first, with their metrics but without the plotted series. */
export function listMeasurementRows(
	revisionId: string
): { m: Omit<MeasurementRow, 'metrics'>; uploader: string }[] {
	return measurementsOfRevision.all({ revisionId });
}

/** A short human label for a sweep: who, what, when. */
export function measurementLabel(
	m: Pick<MeasurementRow, 'kind' | 'targetHz' | 'measuredOn'>,
	uploader: string
): string {
	const who = uploader.replace(/ \(demo\)$/, '');
	const what =
		m.kind === 'build_report'
			? `build report${m.targetHz ? ` at ${formatFrequency(m.targetHz, 5)}` : ''}`
			: 'measurement';
	return `${who}, ${what}${m.measuredOn ? `, ${m.measuredOn}` : ''}`;
}

/** The chart data for GET /api/v1/measurements/[id]: metrics and the display series (≤ 2000 points). */
export function measurementSeries(m: MeasurementRow, uploader: string) {
	const a = m.analysis as unknown as StoredAnalysis;
	return {
		id: m.id,
		kind: m.kind,
		label: measurementLabel(m, uploader),
		z0: a.z0,
		design_hz: a.design_hz,
		claim_used: a.claim_used,
		claim: a.claim ?? null,
		min_vswr: a.min_vswr,
		f_min_vswr_hz: a.f_min_vswr_hz,
		phase_known: a.phase_known,
		warnings: a.warnings ?? [],
		is_demo: m.isDemo,
		series: a.series
	};
}

export type MeasurementSeries = ReturnType<typeof measurementSeries>;
