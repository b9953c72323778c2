// Setting up test data through plain HTTP posts (faster than the UI where the UI is not under test).
import { expect, type APIRequestContext } from '@playwright/test';
import { unique } from './helpers';

/** A design file (test data) with a quarter-wave row at 5.8 GHz; `rows` replaces the rows block. */
export function designFile(
	slug: string,
	rows?: string,
	notes = 'Cut the side to a quarter wave.\n'
) {
	return `---
bandwright: 1
title: Hardening spec patch ${slug}
slug: ${slug}
family: patch
polarization: linear
summary: Hardening spec design (test data).
design_frequency_hz: 5800000000
parameters: []
rows:
${
	rows ??
	`  - key: side
    label: Quarter-wave side
    formula: lambda / 4
    kind: resonant
    tolerance_mm: 0.2`
}
claim:
  centre_hz: 5800000000
  band_lo_hz: 5725000000
  band_hi_hz: 5875000000
  vswr_max: 2
change_note: First try.
---
${notes}`;
}

/** Posts the import form as whoever `request` is signed in as; the raw answer. */
export function postDesignFile(request: APIRequestContext, origin: string, bytes: Buffer | string) {
	return request.post(`${origin}/designs/new?/import`, {
		headers: { origin, accept: 'text/html' },
		multipart: {
			file: { name: 'design.md', mimeType: 'text/markdown', buffer: Buffer.from(bytes) }
		},
		maxRedirects: 0
	});
}

/** Imports a fresh design (r1, a draft); with submit, r1 is submitted for review. */
export async function importDesign(
	request: APIRequestContext,
	origin: string,
	{ submit = false } = {}
) {
	const slug = unique('hard');
	const res = await postDesignFile(request, origin, designFile(slug));
	expect(res.status(), await res.text()).toBe(303);
	expect(res.headers()['location']).toBe(`/designs/${slug}/r/1/edit`);
	if (submit) {
		const sent = await request.post(`${origin}/designs/${slug}/r/1?/submit`, {
			headers: { origin, accept: 'text/html' },
			form: {},
			maxRedirects: 0
		});
		expect(sent.status()).toBe(303);
	}
	return { slug };
}
