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
		}
	}
}

export {};
