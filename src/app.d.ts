// See https://svelte.dev/docs/kit/types#app.d.ts
import type { SessionUser, SessionInfo } from '$lib/server/auth/session';

declare global {
	namespace App {
		interface Locals {
			user: SessionUser | null;
			session: SessionInfo | null;
		}
		interface Error {
			message: string;
			/** The status actually answered, when the edge changes Kit's (a database failure: 503). */
			status?: number;
		}
	}
}

export {};
