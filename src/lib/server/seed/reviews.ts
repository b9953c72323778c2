// Demo reviews: invented verdicts and comments by the invented club's reviewers, marked as demo data.
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { reviews, users } from '../db/schema';
import { toSessionUser, type SessionUser } from '../accounts/auth';
import { contentOf } from '../designs/content';
import { getDesignBySlug } from '../designs/lookups';
import { getRevision } from '../designs/lookups';
import { addComment, noteLineCount } from '../reviews/comments';
import { submitReview } from '../reviews/reviews';

type Step =
	| {
			slug: string;
			n: number;
			by: 'tomas' | 'ines';
			verdict: 'approve' | 'revise';
			summary: string;
	  }
	| {
			slug: string;
			n: number;
			by: 'tomas' | 'ines' | 'author';
			comment: string;
			on: 'row' | 'lines' | 'general';
			reply?: string;
	  };

// Comments come first: a verdict closes the revision to new verdicts, not to comments, but reads better in order.
const STEPS: Step[] = [
	{
		slug: 'biquad-2g4',
		n: 1,
		by: 'ines',
		comment:
			'Demo comment: the side length is cut wire centre to wire centre; say so in the notes.',
		on: 'row',
		reply: 'Demo reply: done in r2.'
	},
	{
		slug: 'biquad-2g4',
		n: 1,
		by: 'ines',
		comment: 'Demo comment: these lines skip how the feed tube is soldered to the reflector.',
		on: 'lines'
	},
	{
		slug: 'biquad-2g4',
		n: 1,
		by: 'ines',
		verdict: 'revise',
		summary: 'Demo review: nearly there; clarify the measuring reference and the feed soldering.'
	},
	{
		slug: 'biquad-2g4',
		n: 2,
		by: 'tomas',
		verdict: 'approve',
		summary: 'Demo review: built it from these notes; the table matches my build within tolerance.'
	},
	{
		slug: 'cp-patch-5g8',
		n: 1,
		by: 'tomas',
		comment: 'Demo comment: check this row against the substrate height you list.',
		on: 'row'
	},
	{
		slug: 'cp-patch-5g8',
		n: 1,
		by: 'tomas',
		verdict: 'revise',
		summary:
			'Demo review: the corner truncation needs a tolerance; at 5.8 GHz it decides the axial ratio.'
	},
	{
		slug: 'cp-patch-5g8',
		n: 2,
		by: 'ines',
		verdict: 'approve',
		summary: 'Demo review: tolerances added; approve.'
	},
	{
		slug: 'cp-patch-5g8',
		n: 3,
		by: 'tomas',
		comment: 'Demo comment: is this value still right after the change of laminate?',
		on: 'row'
	},
	{
		slug: 'cp-patch-5g8',
		n: 3,
		by: 'tomas',
		comment: 'Demo comment: a photo of the probe feed would help here.',
		on: 'lines'
	},
	{
		slug: 'axial-helix-435',
		n: 1,
		by: 'ines',
		verdict: 'approve',
		summary: 'Demo review: proportions match the axial-mode rules of thumb; approve.'
	},
	{
		slug: 'dipole-868',
		n: 1,
		by: 'tomas',
		verdict: 'approve',
		summary: 'Demo review: clear notes and a sensible end-effect shortening; approve.'
	},
	{
		slug: 'ground-plane-144',
		n: 1,
		by: 'tomas',
		comment: 'Demo comment: the radial length looks long for a 45° droop.',
		on: 'row',
		reply: 'Demo reply: shortened in r2.'
	},
	{
		slug: 'ground-plane-144',
		n: 1,
		by: 'tomas',
		verdict: 'revise',
		summary: 'Demo review: please recheck the radials, then resubmit.'
	},
	{
		slug: 'ground-plane-144',
		n: 2,
		by: 'ines',
		verdict: 'approve',
		summary: 'Demo review: radials fixed; approve.'
	},
	{
		slug: 'waveguide-feed-1g3',
		n: 1,
		by: 'tomas',
		verdict: 'approve',
		summary:
			'Demo review: the can diameter sits between TE11 and TM01 cutoff as it should; approve.'
	}
];

function demoUser(email: string): SessionUser | null {
	const row = db.select().from(users).where(eq(users.email, email)).get();
	return row ? toSessionUser(row) : null;
}

export function seedReviews(log: (line: string) => void = console.log): void {
	const reviewers = {
		tomas: demoUser('tomas@lanternhill.example'),
		ines: demoUser('ines@lanternhill.example')
	};
	const done = new Set<string>();
	for (const step of STEPS) {
		const design = getDesignBySlug(step.slug);
		const r = design ? getRevision(design.id, step.n) : null;
		if (!design || !r) continue;
		// Seeding twice adds nothing: a revision that already has reviews is left alone.
		if (
			!done.has(r.id) &&
			db.select({ id: reviews.id }).from(reviews).where(eq(reviews.revisionId, r.id)).get()
		)
			continue;
		done.add(r.id);
		const author = demoUser(
			db.select({ e: users.email }).from(users).where(eq(users.id, r.authorId)).get()!.e
		)!;
		const who = step.by === 'author' ? author : reviewers[step.by];
		if (!who) continue;
		if ('verdict' in step) {
			if (r.state !== 'submitted') continue;
			submitReview(who, r.id, { verdict: step.verdict, summary: step.summary }, { notify: false });
			log(`demo review ${step.slug} r${step.n}: ${step.verdict} by ${step.by}`);
			continue;
		}
		const rows = contentOf(r).rows;
		const lines = noteLineCount(r);
		const anchor =
			step.on === 'row'
				? { kind: 'row' as const, rowKey: rows[0].key }
				: step.on === 'lines' && lines >= 2
					? { kind: 'lines' as const, start: 1, end: 2 }
					: { kind: 'general' as const };
		const c = addComment(who, r.id, { body: step.comment, anchor }, { notify: false });
		if (step.reply)
			addComment(author, r.id, { body: step.reply, parentId: c.id }, { notify: false });
	}
}
