import { requireVerifiedMember } from '$lib/server/http/guards';
import { loadDesignRevision } from '$lib/server/designs/revision-view';
import {
	addAttachment,
	MAX_IMAGE_BYTES,
	MAX_IMAGE_PIXELS
} from '$lib/server/measurements/attachments';
import { uploadAccess } from '$lib/server/measurements/uploads';
import { uploadAction } from '$lib/server/measurements/upload-action';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ params, locals }) => {
	const user = requireVerifiedMember();
	const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
	const access = uploadAccess(user, revision!);
	return {
		design: { slug: design.slug, title: design.title },
		revision: { number: revision!.number, state: revision!.state },
		kind: access.ok ? access.kind : null,
		refusal: access.ok ? null : access.message,
		maxMb: MAX_IMAGE_BYTES / (1024 * 1024),
		maxMegapixels: MAX_IMAGE_PIXELS / 1e6
	};
};

export const actions: Actions = {
	default: (event) =>
		uploadAction(event, { max: MAX_IMAGE_BYTES, what: 'an image', anchor: 'photos' }, addAttachment)
};
