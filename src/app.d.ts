// See https://svelte.dev/docs/kit/types#app.d.ts
import type { Session, SessionUser } from '$lib/server/auth/session';

declare global {
	namespace App {
		interface Error {
			message: string;
			errorId?: string;
		}
		interface Locals {
			user: SessionUser | null;
			session: Session | null;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
