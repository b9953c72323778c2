import { afterAll, describe, expect, it } from 'vitest';
import { createPredictPool, PredictPoolError, type PredictPool } from './pool';

const dipole = {
	model: {
		wires: [{ name: 'd', from: [0, 0, -0.165], to: [0, 0, 0.165], radius: 1e-3 }],
		feed: { wire: 'd', position: 0.5 }
	},
	lo_hz: 350e6,
	hi_hz: 520e6
};
// 600 segments over a wide 2001-point sweep: seconds of work
const heavy = {
	model: {
		wires: [{ name: 'd', from: [0, 0, -5], to: [0, 0, 5], radius: 1e-3, segments: 600 }],
		feed: { wire: 'd', position: 0.5 }
	},
	lo_hz: 10e6,
	hi_hz: 300e6,
	points: 2001
};

describe('prediction pool (worker threads)', () => {
	const pools: PredictPool[] = [];
	afterAll(() => Promise.all(pools.map((p) => p.close())));
	const pool = async (o: Parameters<typeof createPredictPool>[0]) => {
		const p = await createPredictPool(o);
		pools.push(p);
		return p;
	};

	it('answers in a worker what predict answers, refusals included', async () => {
		const p = await pool({ size: 2 });
		const [ok, bad] = await Promise.all([p.run(dipole), p.run({ ...dipole, lo_hz: 'low' })]);
		expect(ok.ok && ok.result.resonance_hz).toBeGreaterThan(400e6);
		expect(!bad.ok && bad.error.path).toBe('lo_hz');
		expect(p.stats()).toMatchObject({ workers: 2, completed: 2, failed: 0 });
	});

	it('stops a job that runs too long, replaces its worker and goes on', async () => {
		const p = await pool({ size: 1, timeoutMs: 1500 });
		await expect(p.run(heavy)).rejects.toMatchObject({ code: 'timeout' });
		const after = await p.run(dipole);
		expect(after.ok).toBe(true);
		expect(p.stats()).toMatchObject({ workers: 1, completed: 1, failed: 1 });
	});

	it('refuses at once when its queue is full, and everything once closed', async () => {
		const p = await pool({ size: 1, maxQueue: 0, timeoutMs: 1500 });
		const running = p.run(heavy).catch((e: PredictPoolError) => e.code);
		await expect(p.run(dipole)).rejects.toBeInstanceOf(PredictPoolError);
		await expect(p.run(dipole)).rejects.toMatchObject({ code: 'busy' });
		await p.close();
		expect(await running).toBe('closed');
		await expect(p.run(dipole)).rejects.toMatchObject({ code: 'closed' });
	});
});
