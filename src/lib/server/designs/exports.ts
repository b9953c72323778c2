import type { TableResult } from '$lib/rf/tables/table';
import { writeDesignFile } from '$lib/design-file';
import type { Design, Revision } from '../db/schema';
import { contentOf } from './content';
import { renderBuildSheet } from './build-sheet';

const BUILD_SHEET_CAUTIONS = [
	"RF exposure: keep people away from a transmitting antenna; follow your regulator's exposure limits.",
	'A high-gain antenna can push a legal transmitter over the EIRP limit; amateur bands need a licence.',
	'Workshop: solder fumes and burns, sharp sheet and tin edges (wear gloves), clamp work and wear eye protection when drilling.',
	'Masts: never near power lines; follow local building and electrical codes. Local rules come first.'
];

export function buildSheetPdf(
	design: Design,
	r: Revision,
	table: TableResult,
	paper: 'a4' | 'letter'
) {
	return renderBuildSheet({
		title: design.title,
		slug: design.slug,
		revision: r.number,
		frequency_hz: table.frequency_hz,
		units: table.units,
		generatedAt: new Date(),
		paper,
		demo: design.isDemo,
		cautions: BUILD_SHEET_CAUTIONS,
		rows: table.rows.map((row) => ({
			key: row.key,
			label: row.label,
			kind: row.kind,
			value_mm: row.value_mm ?? null,
			display: row.display,
			unit: row.unit,
			stock: row.stock ? { name: row.stock.name, value_mm: row.stock.value_mm } : undefined,
			error: row.error?.message
		}))
	});
}

/** RFC 4180 CSV; cells that could start a spreadsheet formula are prefixed with a quote. */
export function tableCsv(table: TableResult): string {
	const cell = (v: unknown) => {
		let s = v === null || v === undefined ? '' : String(v);
		if (/^[=+\-@\t\r]/.test(s) && Number.isNaN(Number(s))) s = `'${s}`;
		return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
	};
	const head = [
		'key',
		'label',
		'kind',
		'value',
		'unit',
		'value_mm',
		'display',
		'stock',
		'stock_mm',
		'hz_per_0_1mm',
		'warnings',
		'error'
	];
	const lines = [head.join(',')];
	for (const r of table.rows) {
		lines.push(
			[
				r.key,
				r.label,
				r.kind,
				r.value,
				r.unit,
				r.value_mm,
				r.display,
				r.stock?.name,
				r.stock?.value_mm,
				r.sensitivity?.hz_per_0_1mm,
				r.warnings.join('; '),
				r.error?.message
			]
				.map(cell)
				.join(',')
		);
	}
	return `# frequency_hz,${table.frequency_hz}\r\n${lines.join('\r\n')}\r\n`;
}

export function designFileOf(design: Design, r: Revision): string {
	return writeDesignFile({
		title: design.title,
		slug: design.slug,
		family: design.family as never,
		polarization: design.polarization,
		summary: design.summary,
		...contentOf(r)
	});
}

export function revisionJson(design: Design, r: Revision, authorName: string) {
	return {
		design: {
			slug: design.slug,
			title: design.title,
			family: design.family,
			polarization: design.polarization,
			summary: design.summary,
			status: design.status,
			demo: design.isDemo
		},
		revision: {
			number: r.number,
			state: r.state,
			author: authorName,
			created_at: r.createdAt.toISOString(),
			submitted_at: r.submittedAt?.toISOString() ?? null,
			...contentOf(r)
		}
	};
}
