import { pathToFileURL } from 'node:url';
import sharp from 'sharp';

const RUNS = 5;

function median(xs: number[]): number {
	const s = [...xs].sort((a, b) => a - b);
	return s[s.length >> 1];
}

/** A 6000 × 4000 (24 MP) JPEG with detail (noise) so the encoder and decoder do real work. */
async function photo24mp(): Promise<Buffer> {
	const w = 6000;
	const h = 4000;
	const small = Buffer.alloc(600 * 400 * 3);
	for (let i = 0; i < small.length; i++) small[i] = (i * 2654435761) >>> 24;
	return sharp(small, { raw: { width: 600, height: 400, channels: 3 } })
		.resize(w, h, { kernel: 'cubic' })
		.jpeg({ quality: 90 })
		.toBuffer();
}

/** 24-megapixel photo → display copy (≤ 1600 px WebP) + thumbnail: time and peak RSS. */
export async function benchMeasurements(): Promise<Record<string, number>> {
	// attachments.ts opens the database on import: keep the bench away from any real one
	process.env.DATABASE_URL ??= ':memory:';
	const { processImage } = await import('../src/lib/server/measurements/attachments');
	const input = await photo24mp();
	const times: number[] = [];
	const rssBefore = process.memoryUsage().rss;
	let peak = rssBefore;
	const timer = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 5);
	for (let i = 0; i < RUNS + 1; i++) {
		const t0 = performance.now();
		await processImage(input);
		if (i > 0) times.push(performance.now() - t0);
	}
	clearInterval(timer);
	peak = Math.max(peak, process.memoryUsage().rss);
	return {
		input_megapixels: 24,
		input_bytes: input.length,
		display_and_thumb_median_ms: median(times),
		display_and_thumb_min_ms: Math.min(...times),
		rss_before_mb: rssBefore / 2 ** 20,
		rss_peak_mb: peak / 2 ** 20,
		max_rss_mb: process.resourceUsage().maxRSS / 1024
	};
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
	const r = await benchMeasurements();
	for (const [k, v] of Object.entries(r))
		console.log(`${k.padEnd(30)} ${Number.isInteger(v) ? v : v.toFixed(1)}`);
}
