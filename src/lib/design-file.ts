/**
 * One revision as one Markdown file: a YAML front-matter block (our own schema, `bandwright: 1`)
 * followed by the build notes. Used for import/export and for the demo designs in content/.
 */
import { parseDocument, stringify } from 'yaml';
import type { Document } from 'yaml';
import { parseFrequency } from './rf/units/frequency';
import { designMetaSchema, revisionContentSchema } from './schemas/design';
import type { DesignMeta, RevisionContent } from './schemas/design';

export type DesignFile = DesignMeta & RevisionContent;
export interface DesignFileError {
	message: string;
	/** Path of the offending field, e.g. "rows[3].formula". */
	field?: string;
	/** 1-based line in the whole file. */
	line?: number;
	column?: number;
}
export type DesignFileResult =
	{ ok: true; value: DesignFile } | { ok: false; error: DesignFileError };

const DESIGN_FILE_VERSION = 1;
export const MAX_DESIGN_FILE_BYTES = 512 * 1024;

const META_KEYS = Object.keys(designMetaSchema.shape);
const CONTENT_KEYS = Object.keys(revisionContentSchema.shape).filter((k) => k !== 'notes');
const KNOWN_KEYS = new Set(['bandwright', 'design_frequency', ...META_KEYS, ...CONTENT_KEYS]);
/** The front matter starts after the opening "---", which is line 1 of the file. */
const FRONT_MATTER_FIRST_LINE = 2;

function fieldPath(path: readonly PropertyKey[]): string {
	return path.reduce<string>((out, part) => {
		if (typeof part === 'number') return `${out}[${part}]`;
		return out ? `${out}.${String(part)}` : String(part);
	}, '');
}

function lineOfOffset(source: string, offset: number): number {
	let line = FRONT_MATTER_FIRST_LINE;
	for (let i = 0; i < offset && i < source.length; i++) if (source[i] === '\n') line++;
	return line;
}

/** Line of the deepest node along `path` that exists in the YAML (the parent of a missing field). */
function lineOfPath(
	doc: Document,
	source: string,
	path: readonly PropertyKey[]
): number | undefined {
	for (let depth = path.length; depth >= 0; depth--) {
		const keys = path.slice(0, depth).map((p) => (typeof p === 'symbol' ? String(p) : p));
		const node = depth === 0 ? doc.contents : doc.getIn(keys, true);
		const range = (node as { range?: [number, number, number] } | undefined)?.range;
		if (range) return lineOfOffset(source, range[0]);
	}
	return undefined;
}

function failure(message: string, extra: Omit<DesignFileError, 'message'> = {}): DesignFileResult {
	const prefix = extra.field ? `${extra.field}: ` : '';
	const suffix = extra.line ? ` (line ${extra.line})` : '';
	return { ok: false, error: { ...extra, message: `${prefix}${message}${suffix}` } };
}

function splitFrontMatter(text: string): { yaml: string; body: string; bodyLine: number } | null {
	const lines = text.split('\n');
	if (lines[0].trimEnd() !== '---') return null;
	const end = lines.findIndex((l, i) => i > 0 && (l.trimEnd() === '---' || l.trimEnd() === '...'));
	if (end === -1) return null;
	let body = lines.slice(end + 1).join('\n');
	// The writer puts one blank line between the block and the notes; take it back off.
	if (body.startsWith('\n')) body = body.slice(1);
	return { yaml: lines.slice(1, end).join('\n'), body, bodyLine: end + 2 };
}

export function parseDesignFile(input: string): DesignFileResult {
	if (typeof input !== 'string') return failure('A design file must be text.');
	if (new TextEncoder().encode(input).length > MAX_DESIGN_FILE_BYTES) {
		return failure('The design file is larger than 512 kB.');
	}
	const text = input.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n');
	const parts = splitFrontMatter(text);
	if (!parts) {
		return failure('The file must start with a front-matter block between two "---" lines.', {
			line: 1
		});
	}

	const doc = parseDocument(parts.yaml, { prettyErrors: true, uniqueKeys: true });
	const yamlError = doc.errors[0];
	if (yamlError) {
		const pos = yamlError.linePos?.[0];
		const message = `YAML syntax error: ${yamlError.message.split(' at line')[0].split('\n')[0]}`;
		return failure(message, pos ? { line: pos.line + 1, column: pos.col } : {});
	}
	let data: unknown;
	try {
		data = doc.toJS({ maxAliasCount: 100 });
	} catch (err) {
		return failure(`YAML could not be read: ${err instanceof Error ? err.message : 'bad alias'}`);
	}
	if (data === null || typeof data !== 'object' || Array.isArray(data)) {
		return failure('The front matter must be a set of "field: value" lines.', { line: 2 });
	}
	const record = { ...(data as Record<string, unknown>) };
	const lineOf = (path: PropertyKey[]) => lineOfPath(doc, parts.yaml, path);

	if (record.bandwright !== DESIGN_FILE_VERSION) {
		const message =
			record.bandwright === undefined
				? 'is required (the front matter starts with "bandwright: 1")'
				: `version ${JSON.stringify(record.bandwright)} is not supported; use 1`;
		return failure(message, { field: 'bandwright', line: lineOf(['bandwright']) });
	}
	const unknown = Object.keys(record).find((k) => !KNOWN_KEYS.has(k));
	if (unknown !== undefined) {
		const hint = unknown === 'notes' ? '; notes go below the front matter' : '';
		return failure(`unknown field${hint}`, { field: unknown, line: lineOf([unknown]) });
	}
	if ('design_frequency' in record) {
		const field = 'design_frequency';
		const line = lineOf([field]);
		if ('design_frequency_hz' in record) {
			return failure('give design_frequency or design_frequency_hz, not both', { field, line });
		}
		const raw = record.design_frequency;
		const parsed = parseFrequency(typeof raw === 'number' ? String(raw) : (raw as string));
		if (!parsed.ok) return failure(parsed.message, { field, line });
		delete record.design_frequency;
		record.design_frequency_hz = parsed.hz;
	}

	const pick = (keys: string[]) => Object.fromEntries(keys.map((k) => [k, record[k]]));
	const meta = designMetaSchema.safeParse(pick(META_KEYS));
	const content = revisionContentSchema.safeParse({ ...pick(CONTENT_KEYS), notes: parts.body });
	const issue = (meta.error ?? content.error)?.issues[0];
	if (issue || !meta.success || !content.success) {
		const path = issue?.path ?? [];
		const line = path[0] === 'notes' ? parts.bodyLine : lineOf(path);
		return failure(issue?.message ?? 'is not valid', { field: fieldPath(path), line });
	}
	return { ok: true, value: { ...meta.data, ...content.data } };
}

function compact<T extends object>(value: T): T {
	return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as T;
}

/** Writes a valid DesignFile; fields come out in a fixed order so files diff well in git. */
export function writeDesignFile(value: DesignFile): string {
	const front = compact({
		bandwright: DESIGN_FILE_VERSION,
		title: value.title,
		slug: value.slug,
		family: value.family,
		polarization: value.polarization,
		summary: value.summary,
		design_frequency_hz: value.design_frequency_hz,
		parameters: value.parameters.map((p) =>
			compact({
				key: p.key,
				label: p.label,
				value: p.value,
				unit: p.unit,
				valid_ratio: p.valid_ratio
			})
		),
		rows: value.rows.map((r) =>
			compact({
				key: r.key,
				label: r.label,
				formula: r.formula,
				kind: r.kind,
				catalogue: r.catalogue,
				tolerance_mm: r.tolerance_mm,
				valid_ratio: r.valid_ratio,
				unit: r.unit
			})
		),
		claim: compact({
			centre_hz: value.claim.centre_hz,
			band_lo_hz: value.claim.band_lo_hz,
			band_hi_hz: value.claim.band_hi_hz,
			vswr_max: value.claim.vswr_max,
			gain_dbi: value.claim.gain_dbi,
			gain_verified: value.claim.gain_verified
		}),
		change_note: value.change_note
	});
	const yaml = stringify(front, { lineWidth: 0, flowCollectionPadding: false });
	return `---\n${yaml}---\n${value.notes ? `\n${value.notes}` : ''}`;
}
