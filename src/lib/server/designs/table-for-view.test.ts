/**
 * One path from a view to its table: the design page, the dimensions API, the CSV export and the
 * build sheet PDF, each called through its own route, give the same rows for one URL.
 */
import { describe, expect, it } from 'vitest';
import { load as pageLoad } from '../../../routes/designs/[slug]/r/[n]/+page.server';
import { GET as apiGet } from '../../../routes/api/v1/designs/[slug]/revisions/[n]/dimensions/+server';
import { GET as csvGet } from '../../../routes/designs/[slug]/r/[n]/table.csv/+server';
import { GET as pdfGet } from '../../../routes/designs/[slug]/r/[n]/build-sheet.pdf/+server';
import { createDesign, starterContent } from './designs';
import { submitRevision } from './revisions';
import { member } from '../../testing/server-setup';
import { pdfText } from '../../testing/pdf-text';

interface Row {
	key: string;
	display: string;
	stock: string;
}

/** A request as the routes read it (the rate limiter needs an address and a user agent). */
function event(path: string, slug: string) {
	const url = new URL(`http://localhost${path}`);
	return {
		url,
		params: { slug, n: '1' },
		locals: { user: null, session: null, requestId: 'test' },
		request: new Request(url, { headers: { 'user-agent': 'vitest' } }),
		getClientAddress: () => '127.0.0.1'
	} as never;
}

/** The export's rows (after its frequency line and header), RFC 4180 (quoted cells may hold commas). */
function csvRows(text: string): string[][] {
	return text
		.trim()
		.split('\r\n')
		.slice(2)
		.map((line) =>
			[...line.matchAll(/("([^"]|"")*"|[^,]*)(,|$)/g)].map((m) =>
				m[1].replace(/^"|"$/g, '').replace(/""/g, '"')
			)
		);
}

describe('tableForView: page, API, CSV and PDF give the same rows', () => {
	it('for one revision at 5.8 GHz in fractional inches with the 5.8 GHz ISM preset', async () => {
		const author = await member('four-outputs@example.org');
		const content = {
			...starterContent(2.45e9),
			rows: [
				{
					key: 'arm',
					label: 'Arm',
					formula: 'lambda / 4',
					kind: 'resonant' as const,
					tolerance_mm: 0.2
				},
				{
					key: 'wire',
					label: 'Wire',
					formula: '1.6 mm',
					kind: 'material' as const,
					catalogue: 'awg'
				},
				{ key: 'gap', label: 'Gap', formula: 'arm / 10 + 1 mm', kind: 'structural' as const },
				{ key: 'turns', label: 'Turns', formula: '4', kind: 'count' as const }
			]
		};
		const { revisionId, slug } = createDesign(
			author,
			{ title: 'Four outputs', family: 'dipole', polarization: 'linear', summary: 'test' },
			content
		);
		submitRevision(author, revisionId);
		const query = '?f=5.8%20GHz&units=in_frac&band=ism-5g8';
		const base = `/designs/${slug}/r/1`;

		const page = (await pageLoad(event(base + query, slug))) as unknown as {
			table: {
				frequency_hz: number;
				rows: { key: string; display: string; stock?: { name: string } }[];
			};
		};
		const fromPage: Row[] = page.table.rows.map((r) => ({
			key: r.key,
			display: r.display,
			stock: r.stock?.name ?? ''
		}));
		expect(page.table.frequency_hz).toBe(5.8e9);
		expect(fromPage.map((r) => r.key)).toEqual(['arm', 'wire', 'gap', 'turns']);
		// [calc] λ/4 at 5.8 GHz = 12.922 mm = 0.5087 in → 33/64 in (0.5156 in) to the nearest 1/64
		expect(fromPage[0].display).toBe('33/64 in');
		expect(fromPage[1].stock).toBe('AWG 14');

		const api = await (
			await apiGet(event(`/api/v1/designs/${slug}/revisions/1/dimensions${query}`, slug))
		).json();
		expect(
			api.rows.map((r: { key: string; display: string; stock?: { name: string } }) => ({
				key: r.key,
				display: r.display,
				stock: r.stock?.name ?? ''
			}))
		).toEqual(fromPage);

		const csv = csvRows(await (await csvGet(event(`${base}/table.csv${query}`, slug))).text());
		// Columns: key, label, kind, value, unit, value_mm, display, stock, …
		expect(csv.map((c) => ({ key: c[0], display: c[6], stock: c[7] }))).toEqual(fromPage);

		const pdf = await pdfText(
			new Uint8Array(
				await (await pdfGet(event(`${base}/build-sheet.pdf${query}`, slug))).arrayBuffer()
			)
		);
		for (const r of fromPage) {
			expect(pdf).toContain(`(${r.key})`);
			expect(pdf).toContain(r.display);
			if (r.stock) expect(pdf).toContain(r.stock);
		}
		expect(pdf).toContain('5.8 GHz');
	});
});
