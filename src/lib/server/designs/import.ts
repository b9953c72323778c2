/**
 * A design file (.md with front matter) becomes a new design whose r1 is a draft, read by the same
 * parser as the export writes. A file arrives finished, so it is held to more than a draft: UTF-8
 * text only (a bad byte is named by its offset, never replaced), and every formula must compile.
 */
import { parseDesignFile } from '$lib/design-file';
import type { SessionUser } from '../accounts/auth';
import { retryBusy } from '../db/busy';
import { DomainError } from '../http/errors';
import { createDesign } from './designs';
import { assertFormulasCompile } from './dimensions';
import { decodeUtf8 } from './utf8';

/** @throws DomainError (422) naming the byte, field or row that is wrong; nothing is stored then. */
export async function importDesignFile(
	user: Pick<SessionUser, 'id'>,
	bytes: Uint8Array
): Promise<{ slug: string }> {
	const text = decodeUtf8(bytes);
	if (!text.ok) {
		throw new DomainError(
			422,
			`The design file is not UTF-8 text: byte ${text.offset} (counted from 0) is not part of a valid character. Save the file as UTF-8 and import it again.`,
			'file'
		);
	}
	const parsed = parseDesignFile(text.text);
	if (!parsed.ok) throw new DomainError(422, parsed.error.message, 'file');
	const { title, slug, family, polarization, summary, ...content } = parsed.value;
	assertFormulasCompile(content);
	return retryBusy(() =>
		createDesign(user, { title, slug, family, polarization, summary }, content)
	);
}
