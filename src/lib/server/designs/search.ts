import { eq } from 'drizzle-orm';
import type { Statement } from 'better-sqlite3';
import { db, sqlite } from '../db';
import { designs } from '../db/schema';
import { defaultRevision } from './lookups';
import { markdownToPlainText } from '../markdown/markdown';
import { makeSnippet } from './snippet';

/**
 * Keeps the FTS row of one design equal to its title, summary and listed revision's notes. The
 * row id is the design's search_rowid, so hits join their design by an integer.
 */
export function reindexDesign(designId: string): void {
	const design = db.select().from(designs).where(eq(designs.id, designId)).get();
	if (!design || design.searchRowid === null) return;
	prepared('DELETE FROM design_search WHERE rowid = ?').run(design.searchRowid);
	const shown = defaultRevision(design);
	if (!shown) return;
	prepared('INSERT INTO design_search (rowid, title, summary, notes) VALUES (?, ?, ?, ?)').run(
		design.searchRowid,
		design.title,
		design.summary,
		markdownToPlainText(shown.notes)
	);
}

/** The words of a person's query (at most 12), as the index tokenizer splits them. */
function queryWords(q: string): string[] {
	return q
		.normalize('NFKC')
		.split(/[^\p{L}\p{N}_]+/u)
		.filter(Boolean)
		.slice(0, 12);
}

/** Words from a person's query as FTS5 prefix terms; FTS syntax in the input is never interpreted. */
export function ftsQuery(q: string): string | null {
	const words = queryWords(q);
	return words.length ? words.map((w) => `"${w.replace(/"/g, '""')}"*`).join(' ') : null;
}

export interface DesignQuery {
	q?: string;
	family?: string;
	polarization?: string;
	/** Claimed band overlaps [lo, hi]. */
	band?: [number, number];
	/** Claimed band contains this frequency. */
	containsHz?: number;
	status?: 'active' | 'retired' | 'all';
	sort?: 'newest' | 'reports' | 'relevance';
	page?: number;
	pageSize?: number;
}

interface ListingRow {
	search_rowid: number;
	slug: string;
	title: string;
	family: string;
	polarization: string;
	summary: string;
	status: string;
	reviewed: number;
	is_demo: number;
	owner: string;
	created_at: number;
	build_reports: number;
	revision_number: number;
	claim_lo_hz: number | null;
	claim_hi_hz: number | null;
}

/** The listed revision's claimed band overlaps [?, ?] (bound as high edge, low edge). */
const CLAIM_OVERLAPS = 'd.listed_lo_hz <= ? AND d.listed_hi_hz >= ?';

// Statements are prepared once per distinct SQL text (a handful: one per filter combination).
const statements = new Map<string, Statement>();
function prepared(text: string): Statement {
	let st = statements.get(text);
	if (!st) {
		st = sqlite.prepare(text);
		statements.set(text, st);
	}
	return st;
}

/**
 * One page of the listing. Filters and sorts read only columns of designs (the listed revision's
 * band and the build-report count are kept there by triggers); a full-text hit finds its design
 * by search_rowid. Names, revision numbers and snippets are fetched for the page's rows only.
 */
export function searchDesigns(query: DesignQuery) {
	const pageSize = Math.min(50, Math.max(1, query.pageSize ?? 20));
	const page = Math.max(1, Math.min(1000, query.page ?? 1));
	const match = query.q ? ftsQuery(query.q) : null;
	if (query.q && !match) return { items: [], total: 0, page, pageSize };

	const where: string[] = [];
	const args: (string | number)[] = [];
	const add = (clause: string, ...values: (string | number)[]) => {
		where.push(clause);
		args.push(...values);
	};
	if (match) add('design_search MATCH ?', match);
	add('d.listed_revision_id IS NOT NULL');
	const status = query.status ?? 'active';
	if (status !== 'all') add('d.status = ?', status);
	if (query.family) add('d.family = ?', query.family);
	if (query.polarization) add('d.polarization = ?', query.polarization);
	if (query.band) add(CLAIM_OVERLAPS, query.band[1], query.band[0]);
	if (query.containsHz !== undefined) add(CLAIM_OVERLAPS, query.containsHz, query.containsHz);
	const filter = match
		? `FROM design_search h JOIN designs d ON d.search_rowid = h.rowid WHERE ${where.join(' AND ')}`
		: `FROM designs d WHERE ${where.join(' AND ')}`;
	// search_rowid last: a total order, so pages never repeat or skip designs created in the same ms.
	const keys =
		query.sort === 'reports'
			? ['build_reports DESC', 'created_at DESC', 'search_rowid DESC']
			: match && query.sort !== 'newest'
				? ['score', 'created_at DESC', 'search_rowid DESC']
				: ['created_at DESC', 'search_rowid DESC'];
	const pageIds = `SELECT d.id, d.search_rowid, d.created_at, d.build_reports${match ? ', h.rank AS score' : ''}
		${filter} ORDER BY ${keys.join(', ')} LIMIT ? OFFSET ?`;
	const rows = prepared(
		`SELECT p.search_rowid, d.slug, d.title, d.family, d.polarization, d.summary, d.status,
			d.shown_revision_id IS NOT NULL AS reviewed, d.is_demo, u.display_name AS owner, d.created_at,
			d.build_reports, r.number AS revision_number, r.claim_lo_hz, r.claim_hi_hz
		FROM (${pageIds}) p JOIN designs d ON d.id = p.id JOIN users u ON u.id = d.owner_id
			JOIN revisions r ON r.id = d.listed_revision_id
		ORDER BY ${keys.map((k) => `p.${k}`).join(', ')}`
	).all(...args, pageSize, (page - 1) * pageSize) as ListingRow[];
	const total = (prepared(`SELECT count(*) AS n ${filter}`).get(...args) as { n: number }).n;
	const texts = match ? indexedTexts(rows) : new Map<number, string[]>();
	const words = match ? queryWords(query.q!) : [];
	const items = rows.map((d) => {
		const text = texts.get(d.search_rowid);
		return {
			slug: d.slug,
			title: d.title,
			family: d.family,
			polarization: d.polarization,
			summary: d.summary,
			status: d.status,
			reviewed: !!d.reviewed,
			isDemo: !!d.is_demo,
			owner: d.owner,
			createdAt: new Date(d.created_at).toISOString(),
			buildReports: d.build_reports,
			snippet: text ? makeSnippet(text, words) : null,
			revisionNumber: d.revision_number,
			claimLoHz: d.claim_lo_hz,
			claimHiHz: d.claim_hi_hz
		};
	});
	return { items, total, page, pageSize };
}

/** The indexed notes, summary and title of the page's rows, for their snippets. */
function indexedTexts(rows: ListingRow[]): Map<number, string[]> {
	if (!rows.length) return new Map();
	const found = prepared(
		'SELECT rowid AS id, notes, summary, title FROM design_search WHERE rowid IN (SELECT value FROM json_each(?))'
	).all(JSON.stringify(rows.map((r) => r.search_rowid))) as {
		id: number;
		notes: string;
		summary: string;
		title: string;
	}[];
	return new Map(found.map((t) => [t.id, [t.notes, t.summary, t.title]]));
}
