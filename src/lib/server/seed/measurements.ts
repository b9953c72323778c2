// Demo sweeps: synthetic, from a series RLC resonator model, stored through the same upload path
// as a member's file and marked as demo data. Never check values.
import { and, desc, eq } from 'drizzle-orm';
import { syntheticResonatorSweep, toTouchstone } from '$lib/rf/sweeps/synthetic';
import type { Sweep } from '$lib/rf/sweeps/types';
import { db } from '../db';
import { designs, measurements, revisions, users } from '../db/schema';
import { toSessionUser } from '../accounts/auth';
import { addMeasurement } from '../measurements/measurements';

export const SYNTHETIC_NOTE = 'Synthetic demo sweep from a resonator model';
const DEMO_COMMENT =
	'Bandwright demo data: synthetic sweep from a series RLC resonator model, not a measurement';

function returnLossCsv(sweep: Sweep): string {
	const lines = [`# ${DEMO_COMMENT}`, 'Frequency (MHz),Return loss (dB)'];
	for (let i = 0; i < sweep.f_hz.length; i++) {
		const rl = -20 * Math.log10(Math.hypot(sweep.re[i], sweep.im[i]));
		lines.push(`${(sweep.f_hz[i] / 1e6).toFixed(3)},${rl.toFixed(3)}`);
	}
	return lines.join('\n') + '\n';
}

interface DemoSweep {
	slug: string;
	/** Revision number; when absent the shown (approved) revision, else the newest. */
	number?: number;
	by: string;
	/** Resonance as a fraction of the design frequency, quality factor, resistance at resonance. */
	f0: number;
	q: number;
	r: number;
	instrument: 'vna' | 'scalar_sweeper' | 'antenna_analyser';
	plane: string;
	date: string;
	seed: number;
	build?: { deviations: string; materials: string };
	extra?: string;
}

const PRIYA = 'priya@lanternhill.example';
const JULES = 'jules@lanternhill.example';

const SWEEPS: DemoSweep[] = [
	{
		slug: 'biquad-2g4',
		by: PRIYA,
		f0: 1.002,
		q: 7,
		r: 56,
		instrument: 'vna',
		plane: 'SOL calibration at the N connector of the feed',
		date: '2025-10-04',
		seed: 11
	},
	{
		slug: 'biquad-2g4',
		number: 1,
		by: PRIYA,
		f0: 0.972,
		q: 7,
		r: 62,
		instrument: 'vna',
		plane: 'SOL calibration at the N connector of the feed',
		date: '2025-09-12',
		seed: 12,
		extra: 'Resonance came out low; r2 shortens the element sides.'
	},
	{
		slug: 'biquad-2g4',
		by: JULES,
		f0: 0.995,
		q: 6.5,
		r: 58,
		instrument: 'antenna_analyser',
		plane: 'OSL at the end of 1 m RG-58 jumper',
		date: '2025-11-02',
		seed: 13,
		build: {
			deviations: 'Reflector 5 mm narrower than drawn.',
			materials: '1.6 mm enamelled copper wire, tinplate reflector.'
		}
	},
	{
		slug: 'axial-helix-435',
		by: JULES,
		f0: 1.0,
		q: 4,
		r: 60,
		instrument: 'vna',
		plane: 'Calibrated at the N connector on the ground plane',
		date: '2025-08-21',
		seed: 21
	},
	{
		slug: 'axial-helix-435',
		by: PRIYA,
		f0: 1.006,
		q: 4.5,
		r: 66,
		instrument: 'antenna_analyser',
		plane: 'OSL at the analyser port, 30 cm jumper',
		date: '2025-09-30',
		seed: 22,
		build: {
			deviations: 'Nine turns instead of ten.',
			materials: '4 mm copper tube on a PVC former.'
		}
	},
	{
		slug: 'cp-patch-5g8',
		by: PRIYA,
		f0: 0.998,
		q: 11,
		r: 52,
		instrument: 'vna',
		plane: 'SOL at the SMA edge connector',
		date: '2025-12-06',
		seed: 31
	},
	{
		slug: 'dipole-868',
		by: PRIYA,
		f0: 1.001,
		q: 9,
		r: 54,
		instrument: 'vna',
		plane: 'SOL at the balun input',
		date: '2025-07-15',
		seed: 41
	},
	{
		slug: 'ground-plane-144',
		by: JULES,
		f0: 0.999,
		q: 14,
		r: 48,
		instrument: 'antenna_analyser',
		plane: 'OSL at the SO-239 socket',
		date: '2025-06-28',
		seed: 51
	},
	{
		slug: 'waveguide-feed-1g3',
		by: PRIYA,
		f0: 1.0,
		q: 9,
		r: 55,
		instrument: 'vna',
		plane: 'SOL at the probe N connector',
		date: '2025-10-19',
		seed: 61
	},
	{
		slug: 'waveguide-feed-1g3',
		number: 1,
		by: JULES,
		f0: 0.948,
		q: 13,
		r: 70,
		instrument: 'scalar_sweeper',
		plane: 'Directional coupler at the feed connector; open/short normalised',
		date: '2025-11-23',
		seed: 62,
		build: {
			deviations: 'Built exactly to the table in a 100 mm paint tin.',
			materials: '100 mm steel paint tin, 2.5 mm brass probe.'
		},
		extra: 'The resonance sits well below the 23 cm band: the claim is not met.'
	}
];

export async function seedMeasurements(log: (line: string) => void = console.log): Promise<void> {
	for (const s of SWEEPS) {
		const design = db.select().from(designs).where(eq(designs.slug, s.slug)).get();
		const row = db.select().from(users).where(eq(users.email, s.by)).get();
		if (!design || !row) continue;
		const r = db
			.select()
			.from(revisions)
			.where(
				and(
					eq(revisions.designId, design.id),
					// the numbered revision, else the one readers see by default, else the newest
					...(s.number
						? [eq(revisions.number, s.number)]
						: design.shownRevisionId
							? [eq(revisions.id, design.shownRevisionId)]
							: [])
				)
			)
			.orderBy(desc(revisions.number))
			.get();
		if (!r) continue;
		const already = db
			.select({ id: measurements.id })
			.from(measurements)
			.where(
				and(
					eq(measurements.revisionId, r.id),
					eq(measurements.uploaderId, row.id),
					eq(measurements.isDemo, true)
				)
			)
			.get();
		if (already) continue;
		const f0 = r.designHz * s.f0;
		const sweep = syntheticResonatorSweep({
			f0_hz: f0,
			q: s.q,
			r_ohm: s.r,
			f_start_hz: r.designHz * 0.85,
			f_stop_hz: r.designHz * 1.15,
			points: 401,
			noise: 0.0015,
			seed: s.seed
		});
		// a scalar sweeper measures magnitude only: its demo file is a CSV of return loss
		const scalar = s.instrument === 'scalar_sweeper';
		const text = scalar
			? returnLossCsv(sweep)
			: toTouchstone(sweep, { unit: 'MHz', format: 'DB', comments: [DEMO_COMMENT] });
		const notes = `${SYNTHETIC_NOTE} (series RLC, Q ${s.q}). Demo data.${s.extra ? ` ${s.extra}` : ''}`;
		const fields: Record<string, string> = {
			instrument: s.instrument,
			reference_plane: s.plane,
			measured_on: s.date,
			notes
		};
		if (s.build) Object.assign(fields, { target_frequency: `${r.designHz} Hz`, ...s.build });
		const made = await addMeasurement(
			toSessionUser(row),
			r,
			{
				fields,
				file: {
					bytes: new TextEncoder().encode(text),
					name: `${s.slug}-r${r.number}-demo.${scalar ? 'csv' : 's1p'}`
				}
			},
			{ isDemo: true }
		);
		log(
			`demo ${made.kind.replace('_', ' ')} on ${s.slug} r${r.number} (${made.claimPass ? 'meets' : 'misses'} its claim)`
		);
	}
}
