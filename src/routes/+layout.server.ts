import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = ({ locals }) => {
	const u = locals.user;
	// Only what the shell needs reaches the browser.
	return {
		user: u ? { displayName: u.displayName, role: u.role, emailVerified: u.emailVerified } : null
	};
};
