import {
	compileTable,
	evaluateTable,
	TableInputError,
	type CompiledTable,
	type EvaluateOptions,
	type TableResult
} from '$lib/rf/tables/table';
import type { RevisionContent } from '$lib/schemas/design';
import { DomainError } from '../http/errors';
import { toTableDefinition, unknownCatalogues } from '$lib/server/designs/revision-table';
import type { Revision } from '../db/schema';
import type { ViewState } from '$lib/rf/units/view-state';
import { contentOf } from './content';
import { getRevisionById } from './lookups';
import { LRUCache } from 'lru-cache';
import { Doorkeeper } from '../http/doorkeeper';

interface Prepared {
	table: CompiledTable;
	/** Rows naming a catalogue this version does not know (kept from older files), with a warning. */
	unknown: { key: string; catalogue: string }[];
}

// Submitted revisions never change, so their compiled tables are kept; drafts are keyed by save time.
const compiled = new LRUCache<string, Prepared>({ max: 500 });

/** What the cache needs of a revision; the content is read only on a miss (see getRevisionHead). */
type RevisionKey = Pick<Revision, 'id' | 'state' | 'updatedAt'> & Partial<Revision>;

function compiledFor(r: RevisionKey): Prepared {
	const key = r.state === 'draft' ? `${r.id}@${r.updatedAt.getTime()}` : r.id;
	let t = compiled.get(key);
	if (!t) {
		const full = r.content ? (r as Revision) : getRevisionById(r.id);
		if (!full) throw new DomainError(404, 'No such design revision.');
		const content = contentOf(full);
		t = { table: compileTable(toTableDefinition(content)), unknown: unknownCatalogues(content) };
		compiled.set(key, t);
	}
	return t;
}

/** The table at any frequency and options (submitting, comparing); pages go through tableForView. */
export function computeRevision(r: RevisionKey, opts: EvaluateOptions): TableResult {
	const { table, unknown } = compiledFor(r);
	const result = evaluateTable(table, opts);
	for (const { key, catalogue } of unknown) {
		result.rows
			.find((row) => row.key === key)
			?.warnings.push(`Unknown stock catalogue "${catalogue}"; not snapped.`);
	}
	return result;
}

/**
 * The one way a revision and a view (frequency, units, band) become rows: the design page, the
 * build sheet, the CSV export and the dimensions API all call this.
 */
export function tableForView(r: RevisionKey, view: ViewState): TableResult {
	return computeRevision(r, {
		frequencyHz: view.frequencyHz,
		units: view.units,
		bandHz: view.band
	});
}

// The API's answer for one view of a submitted revision never changes either, so its JSON text is
// kept (about 8 kB for 40 rows) once that view is asked for a second time. Drafts are computed each time.
const answers = new LRUCache<string, string>({ max: 1000 });
const asked = new Doorkeeper(4096);

/** tableForView as JSON text, as the dimensions API sends it. */
export function tableForViewJson(r: RevisionKey, view: ViewState): string {
	if (r.state === 'draft') return JSON.stringify(tableForView(r, view));
	const key = `${r.id} ${view.frequencyHz} ${view.units} ${view.band?.join(' ') ?? ''}`;
	let text = answers.get(key);
	if (text === undefined) {
		text = JSON.stringify(tableForView(r, view));
		if (asked.seen(key)) answers.set(key, text);
	}
	return text;
}

/** Keys and sizes the engine refuses (unit names such as "mm", function names) are a 422 on that field. */
export function assertCompilable(content: RevisionContent): CompiledTable {
	try {
		return compileTable(toTableDefinition(content));
	} catch (e) {
		if (e instanceof TableInputError)
			throw new DomainError(422, `${e.field}: ${e.message}`, e.field);
		throw e;
	}
}

/**
 * Stricter, for imported files: every parameter and formula must compile as the editor checks them
 * (known names, right dimensions, earlier rows only). A draft may hold such errors while its author
 * works; a file arrives finished. Names the first error at its root, not the rows that depend on it.
 */
export function assertFormulasCompile(content: RevisionContent): void {
	const table = assertCompilable(content);
	const parts = [
		...table.parameters.map((p, i) => ({
			what: 'Parameter',
			i,
			where: `parameters[${i}]`,
			key: p.def.key,
			error: p.error
		})),
		...table.rows.map((r, i) => ({
			what: 'Row',
			i,
			where: `rows[${i}]`,
			key: r.def.key,
			error: r.error
		}))
	].filter((p) => p.error);
	const root = parts.find((p) => !p.error!.message.startsWith('depends on ')) ?? parts[0];
	if (root) {
		const { what, i, where, key, error } = root;
		throw new DomainError(
			422,
			`${what} ${i + 1} "${key}" (${where}): ${error!.message}. Nothing was imported.`,
			where
		);
	}
}
