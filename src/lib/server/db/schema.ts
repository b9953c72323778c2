import { sql } from 'drizzle-orm';
import {
	sqliteTable,
	text,
	integer,
	real,
	blob,
	index,
	uniqueIndex
} from 'drizzle-orm/sqlite-core';

const createdAt = () =>
	integer('created_at', { mode: 'timestamp_ms' })
		.notNull()
		.default(sql`(unixepoch('subsec') * 1000)`);

export const ROLES = ['member', 'reviewer', 'moderator'] as const;
export type Role = (typeof ROLES)[number];

export const users = sqliteTable('users', {
	id: text('id').primaryKey(),
	email: text('email').notNull().unique(),
	displayName: text('display_name').notNull(),
	passwordHash: text('password_hash').notNull(),
	role: text('role', { enum: ROLES }).notNull().default('member'),
	emailVerifiedAt: integer('email_verified_at', { mode: 'timestamp_ms' }),
	disabledAt: integer('disabled_at', { mode: 'timestamp_ms' }),
	notifyOnSubmit: integer('notify_on_submit', { mode: 'boolean' }).notNull().default(false),
	notifyOnFeedback: integer('notify_on_feedback', { mode: 'boolean' }).notNull().default(true),
	followedFamilies: text('followed_families', { mode: 'json' })
		.$type<string[]>()
		.notNull()
		.default([]),
	isDemo: integer('is_demo', { mode: 'boolean' }).notNull().default(false),
	createdAt: createdAt()
});

/** Sessions per Lucia's current guide: token `<id>.<secret>`, only SHA-256(secret) stored. */
export const sessions = sqliteTable(
	'sessions',
	{
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		secretHash: blob('secret_hash', { mode: 'buffer' }).notNull(),
		createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
		lastVerifiedAt: integer('last_verified_at', { mode: 'timestamp_ms' }).notNull()
	},
	(t) => [index('sessions_user_idx').on(t.userId)]
);

export const TOKEN_PURPOSES = ['verify_email', 'reset_password'] as const;
export type TokenPurpose = (typeof TOKEN_PURPOSES)[number];

/** Single-use e-mail tokens (verification, password reset); only SHA-256 of the secret is stored. */
export const emailTokens = sqliteTable(
	'email_tokens',
	{
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		purpose: text('purpose', { enum: TOKEN_PURPOSES }).notNull(),
		secretHash: blob('secret_hash', { mode: 'buffer' }).notNull(),
		expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
		usedAt: integer('used_at', { mode: 'timestamp_ms' }),
		createdAt: createdAt()
	},
	(t) => [index('email_tokens_user_idx').on(t.userId, t.purpose)]
);

export const auditLog = sqliteTable(
	'audit_log',
	{
		id: integer('id').primaryKey({ autoIncrement: true }),
		actorId: text('actor_id').references(() => users.id, { onDelete: 'set null' }),
		action: text('action').notNull(),
		targetType: text('target_type').notNull(),
		targetId: text('target_id').notNull(),
		details: text('details', { mode: 'json' })
			.$type<Record<string, unknown>>()
			.notNull()
			.default({}),
		createdAt: createdAt()
	},
	(t) => [
		index('audit_created_idx').on(t.createdAt),
		index('audit_target_idx').on(t.targetType, t.targetId)
	]
);

export const DESIGN_STATUSES = ['active', 'retired'] as const;
export const POLARIZATION_KEYS = ['linear', 'lhcp', 'rhcp'] as const;

export const designs = sqliteTable(
	'designs',
	{
		id: text('id').primaryKey(),
		slug: text('slug').notNull().unique(),
		title: text('title').notNull(),
		family: text('family').notNull(),
		polarization: text('polarization', { enum: POLARIZATION_KEYS }).notNull(),
		summary: text('summary').notNull().default(''),
		ownerId: text('owner_id')
			.notNull()
			.references(() => users.id),
		status: text('status', { enum: DESIGN_STATUSES }).notNull().default('active'),
		/** The newest approved revision, shown by default. */
		shownRevisionId: text('shown_revision_id'),
		/**
		 * What listings show: the shown revision, else the newest submitted one. Kept by triggers
		 * (drizzle/0002_listing_columns.sql), never written by the app.
		 */
		listedRevisionId: text('listed_revision_id'),
		/** The listed revision's claimed band edges, for band filters; kept by triggers. */
		listedLoHz: real('listed_lo_hz'),
		listedHiHz: real('listed_hi_hz'),
		/** Build reports filed on any of the design's revisions; kept by triggers. */
		buildReports: integer('build_reports').notNull().default(0),
		/** The design's row id in the full-text index (design_search), set once by a trigger. */
		searchRowid: integer('search_rowid').unique(),
		isDemo: integer('is_demo', { mode: 'boolean' }).notNull().default(false),
		createdAt: createdAt(),
		updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull()
	},
	(t) => [
		index('designs_family_idx').on(t.family),
		index('designs_created_idx').on(t.createdAt),
		index('designs_reports_idx').on(t.buildReports, t.createdAt)
	]
);

export const REVISION_STATES = ['draft', 'submitted', 'approved', 'returned', 'withdrawn'] as const;
export type RevisionState = (typeof REVISION_STATES)[number];

export const revisions = sqliteTable(
	'revisions',
	{
		id: text('id').primaryKey(),
		designId: text('design_id')
			.notNull()
			.references(() => designs.id, { onDelete: 'cascade' }),
		number: integer('number').notNull(),
		state: text('state', { enum: REVISION_STATES }).notNull().default('draft'),
		authorId: text('author_id')
			.notNull()
			.references(() => users.id),
		notes: text('notes').notNull().default(''),
		/** Parameters, dimension rows and claim as one JSON document (see $lib/schemas/design). */
		content: text('content', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
		changeNote: text('change_note').notNull().default(''),
		designHz: real('design_hz').notNull(),
		claimLoHz: real('claim_lo_hz'),
		claimHiHz: real('claim_hi_hz'),
		createdAt: createdAt(),
		updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull(),
		submittedAt: integer('submitted_at', { mode: 'timestamp_ms' }),
		decidedAt: integer('decided_at', { mode: 'timestamp_ms' })
	},
	(t) => [
		uniqueIndex('revisions_design_number_idx').on(t.designId, t.number),
		index('revisions_state_idx').on(t.state, t.submittedAt)
	]
);

export const VERDICTS = ['approve', 'revise', 'reject'] as const;

export const reviews = sqliteTable(
	'reviews',
	{
		id: text('id').primaryKey(),
		revisionId: text('revision_id')
			.notNull()
			.references(() => revisions.id, { onDelete: 'cascade' }),
		reviewerId: text('reviewer_id')
			.notNull()
			.references(() => users.id),
		verdict: text('verdict', { enum: VERDICTS }).notNull(),
		summary: text('summary').notNull(),
		confirmedById: text('confirmed_by_id').references(() => users.id),
		confirmedAt: integer('confirmed_at', { mode: 'timestamp_ms' }),
		createdAt: createdAt()
	},
	(t) => [index('reviews_revision_idx').on(t.revisionId)]
);

export const ANCHOR_KINDS = ['general', 'row', 'lines'] as const;

export const comments = sqliteTable(
	'comments',
	{
		id: text('id').primaryKey(),
		revisionId: text('revision_id')
			.notNull()
			.references(() => revisions.id, { onDelete: 'cascade' }),
		authorId: text('author_id')
			.notNull()
			.references(() => users.id),
		parentId: text('parent_id'),
		anchorKind: text('anchor_kind', { enum: ANCHOR_KINDS }).notNull().default('general'),
		anchorRowKey: text('anchor_row_key'),
		anchorLineStart: integer('anchor_line_start'),
		anchorLineEnd: integer('anchor_line_end'),
		body: text('body').notNull(),
		resolvedAt: integer('resolved_at', { mode: 'timestamp_ms' }),
		resolvedById: text('resolved_by_id').references(() => users.id),
		createdAt: createdAt()
	},
	(t) => [index('comments_revision_idx').on(t.revisionId)]
);

export const MEASUREMENT_KINDS = ['measurement', 'build_report'] as const;
export const INSTRUMENT_CLASSES = ['vna', 'scalar_sweeper', 'antenna_analyser'] as const;

export const measurements = sqliteTable(
	'measurements',
	{
		id: text('id').primaryKey(),
		revisionId: text('revision_id')
			.notNull()
			.references(() => revisions.id, { onDelete: 'cascade' }),
		uploaderId: text('uploader_id')
			.notNull()
			.references(() => users.id),
		kind: text('kind', { enum: MEASUREMENT_KINDS }).notNull(),
		instrument: text('instrument', { enum: INSTRUMENT_CLASSES }).notNull(),
		referencePlane: text('reference_plane').notNull().default(''),
		measuredOn: text('measured_on'),
		notes: text('notes').notNull().default(''),
		targetHz: real('target_hz'),
		deviations: text('deviations').notNull().default(''),
		materials: text('materials').notNull().default(''),
		fileKey: text('file_key').notNull(),
		fileName: text('file_name').notNull(),
		fileType: text('file_type').notNull(),
		fileSize: integer('file_size').notNull(),
		/** Derived metrics and the downsampled series, computed once at upload. */
		analysis: text('analysis', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
		/** `analysis` without its plotted series, for listings; kept by a trigger (drizzle/0003). */
		metrics: text('metrics', { mode: 'json' }).$type<Record<string, unknown>>(),
		claimPass: integer('claim_pass', { mode: 'boolean' }),
		isDemo: integer('is_demo', { mode: 'boolean' }).notNull().default(false),
		createdAt: createdAt()
	},
	(t) => [index('measurements_revision_idx').on(t.revisionId)]
);

export const ATTACHMENT_KINDS = ['photo', 'sweep_image'] as const;

export const attachments = sqliteTable(
	'attachments',
	{
		id: text('id').primaryKey(),
		revisionId: text('revision_id')
			.notNull()
			.references(() => revisions.id, { onDelete: 'cascade' }),
		uploaderId: text('uploader_id')
			.notNull()
			.references(() => users.id),
		kind: text('kind', { enum: ATTACHMENT_KINDS }).notNull(),
		caption: text('caption').notNull().default(''),
		displayKey: text('display_key').notNull(),
		thumbKey: text('thumb_key').notNull(),
		originalKey: text('original_key'),
		originalType: text('original_type'),
		width: integer('width').notNull(),
		height: integer('height').notNull(),
		createdAt: createdAt()
	},
	(t) => [index('attachments_revision_idx').on(t.revisionId)]
);

export const retirements = sqliteTable(
	'retirements',
	{
		id: text('id').primaryKey(),
		designId: text('design_id')
			.notNull()
			.references(() => designs.id, { onDelete: 'cascade' }),
		moderatorId: text('moderator_id')
			.notNull()
			.references(() => users.id),
		reason: text('reason').notNull(),
		evidenceMeasurementId: text('evidence_measurement_id').references(() => measurements.id),
		createdAt: createdAt(),
		reinstatedAt: integer('reinstated_at', { mode: 'timestamp_ms' }),
		reinstatedById: text('reinstated_by_id').references(() => users.id)
	},
	(t) => [index('retirements_design_idx').on(t.designId)]
);

/** Outgoing notification mails waiting for delivery (sent after the transaction commits). */
export const mailQueue = sqliteTable('mail_queue', {
	id: integer('id').primaryKey({ autoIncrement: true }),
	toAddress: text('to_address').notNull(),
	subject: text('subject').notNull(),
	body: text('body').notNull(),
	attempts: integer('attempts').notNull().default(0),
	lastError: text('last_error'),
	sentAt: integer('sent_at', { mode: 'timestamp_ms' }),
	nextAttemptAt: integer('next_attempt_at', { mode: 'timestamp_ms' }).notNull(),
	createdAt: createdAt()
});

/**
 * One row whose counter every write to what public pages show moves on (triggers in
 * drizzle/0004_page_stamp.sql, never written by the app). Cached pages remember the stamp they were
 * rendered at and are thrown away when it has moved (src/lib/server/page-cache.ts).
 */
export const pageStamp = sqliteTable('page_stamp', {
	id: integer('id').primaryKey(),
	stamp: integer('stamp').notNull()
});

export type User = typeof users.$inferSelect;
export type Design = typeof designs.$inferSelect;
export type Revision = typeof revisions.$inferSelect;
