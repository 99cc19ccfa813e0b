// See https://svelte.dev/docs/kit/types#app.d.ts
import type { Principal } from '$lib/server/auth/principal';
import type { Session, SessionUser } from '$lib/server/auth/session';

declare global {
	namespace App {
		interface Error {
			message: string;
			errorId?: string;
		}
		interface Locals {
			/** Who is asking: resolved once in hooks.server.ts; the access module reads it. */
			principal: Principal;
			/** The member signed in with the session cookie (pages); null for API tokens and anonymous callers. */
			user: SessionUser | null;
			session: Session | null;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
