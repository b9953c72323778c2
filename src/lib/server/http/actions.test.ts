import { describe, expect, it } from 'vitest';
import { z } from '$lib/zod';
import { importDesignSchema } from '$lib/schemas/new-design';
import { actionFailure, firstProblem, readForm } from './actions';
import { DomainError } from './errors';

describe('readForm', () => {
	it('lets a file through only where asked, and names the first problem', async () => {
		const fd = new FormData();
		fd.append('file', new File(['# design'], 'd.md', { type: 'text/markdown' }));
		const ok = await readForm(fd, importDesignSchema, { files: true });
		expect(ok.valid).toBe(true);
		expect(await (ok.data.file as File).text()).toBe('# design');
		const empty = await readForm(new FormData(), importDesignSchema, { files: true });
		expect(empty.valid).toBe(false);
		expect(firstProblem(empty)).toEqual({
			field: 'file',
			message: 'Choose a design file (.md) to import.'
		});
	});

	it('reads repeated fields as a list and a checkbox as a boolean', async () => {
		const fd = new FormData();
		fd.append('tag', 'a');
		fd.append('tag', '');
		fd.append('on', 'on');
		const schema = z.object({
			tag: z.array(z.string()).default([]),
			on: z.boolean().default(false),
			off: z.boolean().default(false)
		});
		expect((await readForm(fd, schema)).data).toEqual({ tag: ['a', ''], on: true, off: false });
	});
});

describe('actionFailure', () => {
	it('turns a DomainError into its status, message and field, with what the page adds', () => {
		const f = actionFailure(new DomainError(409, 'Taken.', 'slug'), { values: { slug: 'x' } });
		expect(f.status).toBe(409);
		expect(f.data).toEqual({
			message: 'Taken.',
			field: 'slug',
			line: null,
			column: null,
			values: { slug: 'x' }
		});
	});

	it('throws anything else on, so handleError logs it', () => {
		expect(() => actionFailure(new TypeError('bug'))).toThrow('bug');
	});
});
