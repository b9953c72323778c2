import { and, desc, eq, sql, type SQL } from 'drizzle-orm';
import { db, sqlite } from './db';
import { designs, measurements, revisions, users } from './db/schema';
import { defaultRevision } from './designs';
import { markdownToPlainText } from './markdown';

/** Keeps the FTS row of one design equal to its title, summary and shown revision's notes. */
export function reindexDesign(designId: string): void {
	const design = db.select().from(designs).where(eq(designs.id, designId)).get();
	sqlite.prepare('DELETE FROM design_search WHERE design_id = ?').run(designId);
	if (!design) return;
	const shown = defaultRevision(design);
	if (!shown) return;
	sqlite
		.prepare('INSERT INTO design_search (design_id, title, summary, notes) VALUES (?, ?, ?, ?)')
		.run(designId, design.title, design.summary, markdownToPlainText(shown.notes));
}

/** Words from a person's query as FTS5 prefix terms; FTS syntax in the input is never interpreted. */
export function ftsQuery(q: string): string | null {
	const words = q
		.normalize('NFKC')
		.split(/[^\p{L}\p{N}_]+/u)
		.filter(Boolean)
		.slice(0, 12);
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

export type SnippetPart = { text: string; hit: boolean };

const HIT_START = '\u0001';
const HIT_END = '\u0002';

export function snippetParts(s: string): SnippetPart[] {
	const parts: SnippetPart[] = [];
	for (const chunk of s.split(HIT_START)) {
		const [inside, after] = chunk.includes(HIT_END) ? chunk.split(HIT_END, 2) : [null, chunk];
		if (inside !== null) parts.push({ text: inside, hit: true });
		if (after) parts.push({ text: after, hit: false });
	}
	return parts;
}

export function searchDesigns(query: DesignQuery) {
	const pageSize = Math.min(50, Math.max(1, query.pageSize ?? 20));
	const page = Math.max(1, Math.min(1000, query.page ?? 1));
	const shown = sql`coalesce(${designs.shownRevisionId}, (select r.id from revisions r where r.design_id = ${designs.id} and r.state in ('submitted','approved') order by r.number desc limit 1))`;
	const conditions: SQL[] = [sql`${shown} is not null`];
	const status = query.status ?? 'active';
	if (status !== 'all') conditions.push(eq(designs.status, status));
	if (query.family) conditions.push(eq(designs.family, query.family));
	if (query.polarization) conditions.push(sql`${designs.polarization} = ${query.polarization}`);
	if (query.band) {
		conditions.push(sql`exists (select 1 from revisions r where r.id = ${shown} and r.claim_lo_hz <= ${query.band[1]} and r.claim_hi_hz >= ${query.band[0]})`);
	}
	if (query.containsHz !== undefined) {
		conditions.push(sql`exists (select 1 from revisions r where r.id = ${shown} and r.claim_lo_hz <= ${query.containsHz} and r.claim_hi_hz >= ${query.containsHz})`);
	}
	const match = query.q ? ftsQuery(query.q) : null;
	if (query.q && !match) return { items: [], total: 0, page, pageSize };
	if (match) {
		conditions.push(sql`${designs.id} in (select design_id from design_search where design_search match ${match})`);
	}
	const reports = sql<number>`(select count(*) from ${measurements} m join ${revisions} r on r.id = m.revision_id where r.design_id = ${designs.id} and m.kind = 'build_report')`;
	const snippet = match
		? sql<string>`(select snippet(design_search, -1, ${HIT_START}, ${HIT_END}, '…', 14) from design_search where design_search match ${match} and design_id = ${designs.id})`
		: sql<string>`null`;
	const where = and(...conditions);
	const order =
		query.sort === 'reports'
			? [desc(reports), desc(designs.createdAt)]
			: match && query.sort !== 'newest'
				? [sql`(select bm25(design_search) from design_search where design_search match ${match} and design_id = ${designs.id})`, desc(designs.createdAt)]
				: [desc(designs.createdAt)];
	const items = db
		.select({
			slug: designs.slug,
			title: designs.title,
			family: designs.family,
			polarization: designs.polarization,
			summary: designs.summary,
			status: designs.status,
			reviewed: sql<number>`${designs.shownRevisionId} is not null`,
			isDemo: designs.isDemo,
			owner: users.displayName,
			createdAt: designs.createdAt,
			buildReports: reports,
			snippet,
			revisionNumber: sql<number>`(select number from revisions r where r.id = ${shown})`,
			claimLoHz: sql<number | null>`(select claim_lo_hz from revisions r where r.id = ${shown})`,
			claimHiHz: sql<number | null>`(select claim_hi_hz from revisions r where r.id = ${shown})`
		})
		.from(designs)
		.innerJoin(users, eq(users.id, designs.ownerId))
		.where(where)
		.orderBy(...order)
		.limit(pageSize)
		.offset((page - 1) * pageSize)
		.all()
		.map((d) => ({
			...d,
			reviewed: !!d.reviewed,
			createdAt: d.createdAt.toISOString(),
			snippet: d.snippet ? snippetParts(d.snippet) : null
		}));
	const total = db.select({ n: sql<number>`count(*)` }).from(designs).where(where).get()?.n ?? 0;
	return { items, total, page, pageSize };
}

