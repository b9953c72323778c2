/** 10 000 generated designs (not real designs), then the median time of typical queries. */
import { sqlite } from '../src/lib/server/db';
import { createDesign, starterContent } from '../src/lib/server/designs/designs';
import { submitRevision } from '../src/lib/server/designs/revisions';
import { searchDesigns } from '../src/lib/server/designs/search';
import type { SessionUser } from '../src/lib/server/accounts/auth';

const WORDS = [
	'copper',
	'reflector',
	'tinplate',
	'balun',
	'coax',
	'washer',
	'standoff',
	'helix',
	'patch',
	'dipole',
	'radial',
	'feed',
	'probe',
	'solder',
	'epoxy',
	'laminate',
	'sleeve',
	'choke',
	'mast',
	'clamp'
];
const FAMILIES = ['biquad', 'patch', 'helical', 'dipole', 'ground_plane', 'yagi_uda'] as const;

function median(xs: number[]) {
	const s = [...xs].sort((a, b) => a - b);
	return s[Math.floor(s.length / 2)];
}

export async function benchSearch(
	owner: SessionUser,
	count = 10_000
): Promise<Record<string, number>> {
	let seed = 7;
	const rnd = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
	const t0 = performance.now();
	sqlite.exec('BEGIN');
	for (let i = 0; i < count; i++) {
		const hz = [144e6, 435e6, 868e6, 1.3e9, 2.45e9, 5.8e9][i % 6];
		const notes = Array.from({ length: 60 }, () => WORDS[Math.floor(rnd() * WORDS.length)]).join(
			' '
		);
		const { revisionId } = createDesign(
			owner,
			{
				title: `Generated design ${i} ${WORDS[i % WORDS.length]}`,
				slug: `gen-${i}`,
				family: FAMILIES[i % FAMILIES.length],
				polarization: 'linear',
				summary: `generated ${WORDS[(i * 7) % WORDS.length]}`
			},
			{ ...starterContent(hz), notes }
		);
		submitRevision(owner, revisionId);
	}
	sqlite.exec('COMMIT');
	const loadMs = performance.now() - t0;
	const queries = [
		{ q: 'tinplate reflector' },
		{ q: 'balun', family: 'dipole' },
		{ q: 'copper', containsHz: 2.45e9 },
		{ q: 'sol' },
		{ family: 'patch', band: [5.725e9, 5.875e9] as [number, number] },
		{ q: 'helix radial choke', sort: 'reports' as const }
	];
	const times: number[] = [];
	for (let round = 0; round < 10; round++) {
		for (const q of queries) {
			const t = performance.now();
			searchDesigns({ ...q, page: 1 + (round % 3) });
			times.push(performance.now() - t);
		}
	}
	return {
		'designs generated (count)': count,
		'generate + index (s)': loadMs / 1000,
		'search median (ms, target ≤ 20)': median(times),
		'search worst (ms)': Math.max(...times)
	};
}
