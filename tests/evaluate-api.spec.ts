import { expect, test } from '@playwright/test';

const rows = [
	{ key: 'quarter', formula: 'lambda / 4', kind: 'resonant' },
	{ key: 'wire', formula: '1.7 mm', kind: 'material', catalogue: 'awg' },
	{ key: 'bad', formula: 'lambda / nowhere', kind: 'resonant' },
	{ key: 'after', formula: 'bad * 2', kind: 'structural' }
];

test('POST /api/v1/evaluate computes a table through the built server', async ({ request }) => {
	const res = await request.post('/api/v1/evaluate', {
		data: { frequency_hz: 5.8e9, parameters: [], rows, band_hz: [5.725e9, 5.875e9] }
	});
	expect(res.status()).toBe(200);
	const body = await res.json();
	// λ/4 at 5.8 GHz = 12.9221 mm [calc λ = c/f, c = 299 792 458 m/s exact, SI Brochure 9th ed.]
	expect(body.rows[0].value_mm).toBeCloseTo(12.9221, 4);
	expect(body.rows[0].sensitivity.first_order).toBe(true);
	// AWG 14 = 1.628 mm (ASTM B258 formula d = 0.127 mm × 92^((36−n)/39)) [calc]
	expect(body.rows[1].stock.name).toBe('AWG 14');
	expect(body.rows[2].error.message).toContain('nowhere');
	expect(body.rows[3].error.message).toContain('depends on bad');
});

test('bad evaluate requests get 400 with the field, never a 500', async ({ request }) => {
	const cases: [unknown, string][] = [
		[{ frequency_hz: 0, parameters: [], rows }, 'frequency_hz'],
		[{ frequency_hz: 2e12, parameters: [], rows }, 'frequency_hz'],
		[{ frequency_hz: 'x', parameters: [], rows }, 'frequency_hz'],
		[
			{ frequency_hz: 1e9, parameters: [], rows: [{ key: 'a', formula: '1', kind: 'huge' }] },
			'rows[0].kind'
		],
		[
			{
				frequency_hz: 1e9,
				parameters: [],
				rows: Array.from({ length: 201 }, (_, i) => ({
					key: `r${i}`,
					formula: '1 mm',
					kind: 'structural'
				}))
			},
			'rows'
		],
		[[], 'body']
	];
	for (const [data, field] of cases) {
		const res = await request.post('/api/v1/evaluate', { data });
		expect(res.status(), JSON.stringify(data).slice(0, 80)).toBe(400);
		expect((await res.json()).error.field).toBe(field);
	}
	const notJson = await request.post('/api/v1/evaluate', {
		data: '{oops',
		headers: { 'content-type': 'application/json' }
	});
	expect(notJson.status()).toBe(400);
	const sandbox = await request.post('/api/v1/evaluate', {
		data: {
			frequency_hz: 1e9,
			parameters: [],
			rows: [{ key: 'a', formula: 'cos.constructor("return process")()', kind: 'structural' }]
		}
	});
	expect(sandbox.status()).toBe(200);
	expect((await sandbox.json()).rows[0].error).toBeTruthy();
});

test('the dimensions API rescales a stored revision and rejects bad parameters', async ({
	request
}) => {
	const ok = await request.get(
		'/api/v1/designs/dipole-868/revisions/1/dimensions?f=433.92%20MHz&units=in'
	);
	expect(ok.status()).toBe(200);
	expect((await ok.json()).units).toBe('in');
	expect(
		(await request.get('/api/v1/designs/dipole-868/revisions/1/dimensions?f=abc')).status()
	).toBe(400);
	expect(
		(await request.get('/api/v1/designs/dipole-868/revisions/1/dimensions?units=cubits')).status()
	).toBe(400);
	expect((await request.get('/api/v1/designs/no-such/revisions/1/dimensions')).status()).toBe(404);
	expect((await request.get('/api/v1/designs/dipole-868/revisions/99/dimensions')).status()).toBe(
		404
	);
});

test('the benchmark floor route does not exist outside the benchmark', async ({ request }) => {
	const res = await request.post('/dev/bench/post-floor', { data: { frequency_hz: 1 } });
	expect(res.status()).toBe(404);
});
