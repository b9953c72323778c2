// See https://svelte.dev/docs/kit/types#app.d.ts
import type { SessionUser, Session } from '$lib/server/accounts/auth';

declare global {
	namespace App {
		interface Error {
			message: string;
			errorId?: string;
		}
		interface Locals {
			user: SessionUser | null;
			session: Session | null;
			requestId: string;
			/** Set by handleError when a write met a database lock; the response becomes a 503. */
			busy?: boolean;
		}
	}
}

export {};
