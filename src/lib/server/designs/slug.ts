/** A URL slug from a title: lower-case ASCII words joined by "-", at most 80 characters. */
export function slugify(title: string): string {
	const s = title
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 80)
		.replace(/-+$/, '');
	return s || 'design';
}

/** Whether a URL segment can be a slug at all (checked before any lookup). */
export const isSlug = (s: string): boolean => /^[a-z0-9-]{1,80}$/.test(s);
