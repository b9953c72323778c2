/** Reads what a generated PDF draws: content-stream operators and the text shown with Tj. */
import { PDFDocument, PDFRawStream, decodePDFRawStream } from 'pdf-lib';
import type { PDFArray, PDFPage } from 'pdf-lib';

export interface Op {
	op: string;
	args: string[];
	tag: string | null;
}

/** Operators of a page's content streams, each with the marked-content tag it sits in. */
export function operators(page: PDFPage): Op[] {
	const contents = page.node.Contents();
	const streams =
		contents instanceof PDFRawStream ? [contents] : ((contents as PDFArray).asArray() as unknown[]);
	let source = '';
	for (const ref of streams) {
		const stream = ref instanceof PDFRawStream ? ref : page.doc.context.lookup(ref as never);
		source +=
			Buffer.from(decodePDFRawStream(stream as PDFRawStream).decode()).toString('latin1') + '\n';
	}
	const tokens =
		source.match(/<[0-9A-Fa-f\s]*>|\/[^\s/[\]<>()]+|\[|\]|\((?:\\.|[^\\)])*\)|[^\s[\]<>/()]+/g) ??
		[];
	const ops: Op[] = [];
	const tags: string[] = [];
	let args: string[] = [];
	for (const token of tokens) {
		if (/^[A-Za-z'"*][A-Za-z0-9*]*$/.test(token) && !['true', 'false', 'null'].includes(token)) {
			if (token === 'BMC') tags.push(args[0]);
			if (token === 'EMC') tags.pop();
			ops.push({ op: token, args, tag: tags[tags.length - 1] ?? null });
			args = [];
		} else args.push(token);
	}
	return ops;
}

// cp1252 bytes 0x80-0x9F (the rest of WinAnsi is Latin-1); Node's TextDecoder treats them as C1.
const CP1252_HIGH = '€\u0081‚ƒ„…†‡ˆ‰Š‹Œ\u008dŽ\u008f\u0090‘’“”•–—˜™š›œ\u009džŸ';
export const decodeHex = (hex: string) =>
	[...Buffer.from(hex.slice(1, -1), 'hex')]
		.map((b) => (b >= 0x80 && b <= 0x9f ? CP1252_HIGH[b - 0x80] : String.fromCharCode(b)))
		.join('');
/** Text shown with Tj, decoded from pdf-lib's hex strings (WinAnsi = cp1252). */
export const shownText = (ops: Op[]) =>
	ops
		.filter((o) => o.op === 'Tj')
		.map((o) => decodeHex(o.args[0]))
		.join('\n');

/** All text a PDF shows, page by page. */
export async function pdfText(bytes: Uint8Array): Promise<string> {
	const doc = await PDFDocument.load(bytes);
	return shownText(doc.getPages().flatMap(operators));
}
