/** The design page's measurements section: sweeps, pass counts, photos, who may upload. */
import { eq, sql } from 'drizzle-orm';
import { db } from '../db';
import { measurements, revisions, type Design, type Revision } from '../db/schema';
import type { SessionUser } from '../accounts/auth';
import { contentOf } from '../designs/content';
import { listAttachments } from './attachments';
import {
	listMeasurementRows,
	measurementLabel,
	type MeasurementRow,
	type StoredAnalysis
} from './measurements';
import { uploadAccess, type UploadKind } from './uploads';

/** One sweep as the design page lists it (no series: the client fetches those). */
function measurementSummary(
	m: Omit<MeasurementRow, 'metrics'>,
	uploader: string,
	r: Pick<Revision, 'state'>
) {
	const a = m.analysis as unknown as StoredAnalysis;
	return {
		id: m.id,
		kind: m.kind,
		label: measurementLabel(m, uploader),
		uploader,
		instrument: m.instrument,
		referencePlane: m.referencePlane,
		measuredOn: m.measuredOn,
		notes: m.notes,
		targetHz: m.targetHz,
		deviations: m.deviations,
		materials: m.materials,
		fileName: m.fileName,
		fileSize: m.fileSize,
		isDemo: m.isDemo,
		createdAt: m.createdAt.toISOString(),
		points: a.points,
		f_start_hz: a.f_start_hz,
		f_stop_hz: a.f_stop_hz,
		min_vswr: a.min_vswr,
		f_min_vswr_hz: a.f_min_vswr_hz,
		bands_vswr_2: a.bands_vswr_2,
		vswr_at_design: a.vswr_at_design,
		design_hz: a.design_hz,
		phase_known: a.phase_known,
		/** Stored with the analysis since issue 20; older sweeps have none. */
		warnings: a.warnings ?? [],
		claim: a.claim ? { ...a.claim, ...a.claim_used } : null,
		/** A build report on a revision no reviewer has approved (yet). */
		unreviewedBase: m.kind === 'build_report' && r.state !== 'approved'
	};
}

export interface PassCount {
	total: number;
	pass: number;
}

const designCounts = db
	.select({
		kind: measurements.kind,
		pass: measurements.claimPass,
		state: revisions.state,
		authorId: revisions.authorId
	})
	.from(measurements)
	.innerJoin(revisions, eq(revisions.id, measurements.revisionId))
	.where(eq(revisions.designId, sql.placeholder('designId')))
	.prepare();

/** Author's measurements and build reports over every revision of the design the reader can see. */
function designMeasurementCounts(designId: string, user: SessionUser | null) {
	const rows = designCounts
		.all({ designId })
		.filter((x) => x.state !== 'draft' || x.authorId === user?.id);
	const count = (kind: UploadKind): PassCount => {
		const of = rows.filter((x) => x.kind === kind);
		return { total: of.length, pass: of.filter((x) => x.pass === true).length };
	};
	return { measurements: count('measurement'), buildReports: count('build_report') };
}

/** The design page's measurements section: `...measurementsPanelData(design, r, user)` in revisionPageData. */
export function measurementsPanelData(design: Design, r: Revision, user: SessionUser | null) {
	const access = uploadAccess(user, r);
	const claim = contentOf(r).claim;
	const items = listMeasurementRows(r.id).map(({ m, uploader }) =>
		measurementSummary(m, uploader, r)
	);
	const on = (kind: UploadKind): PassCount => {
		const of = items.filter((x) => x.kind === kind);
		return { total: of.length, pass: of.filter((x) => x.claim?.pass === true).length };
	};
	return {
		measurementsPanel: {
			base: `/designs/${design.slug}/r/${r.number}`,
			revisionNumber: r.number,
			revisionState: r.state,
			designHz: r.designHz,
			claim: {
				band_lo_hz: claim.band_lo_hz,
				band_hi_hz: claim.band_hi_hz,
				vswr_max: claim.vswr_max
			},
			items,
			photos: listAttachments(r.id),
			onRevision: { measurements: on('measurement'), buildReports: on('build_report') },
			onDesign: designMeasurementCounts(design.id, user),
			upload: access.ok ? access.kind : null,
			uploadRefusal: access.ok ? null : access.message
		}
	};
}
