import { requireVerifiedMember } from '$lib/server/http/guards';
import { loadDesignRevision } from '$lib/server/designs/revision-view';
import { addMeasurement, MAX_SWEEP_BYTES } from '$lib/server/measurements/measurements';
import { contentOf } from '$lib/server/designs/content';
import { ownerName } from '$lib/server/accounts/users';
import { uploadAccess } from '$lib/server/measurements/uploads';
import { uploadAction } from '$lib/server/measurements/upload-action';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ params, locals }) => {
	const user = requireVerifiedMember();
	const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
	const r = revision!;
	const access = uploadAccess(user, r);
	const claim = contentOf(r).claim;
	return {
		design: { slug: design.slug, title: design.title },
		revision: {
			number: r.number,
			state: r.state,
			designHz: r.designHz,
			author: ownerName(r.authorId)
		},
		claim: { band_lo_hz: claim.band_lo_hz, band_hi_hz: claim.band_hi_hz, vswr_max: claim.vswr_max },
		kind: access.ok ? access.kind : null,
		refusal: access.ok ? null : access.message,
		maxMb: MAX_SWEEP_BYTES / (1024 * 1024)
	};
};

export const actions: Actions = {
	default: (event) =>
		uploadAction(
			event,
			{ max: MAX_SWEEP_BYTES, what: 'a sweep', anchor: 'measurements' },
			addMeasurement
		)
};
