// See https://svelte.dev/docs/kit/types#app.d.ts
import type { SessionUser } from '$lib/server/session';

declare global {
	namespace App {
		interface Error {
			message: string;
			/** Set when the database could not be reached (see `src/lib/server/outage.ts`). */
			reason?: 'database-unreachable';
			/** Set on an unexpected error: the same id is in the server's log beside the stack. */
			errorId?: string;
		}
		interface Locals {
			/** The signed-in user, from the Auth.js session cookie or a personal access token; null when anonymous. */
			user: SessionUser | null;
			/** How the user was identified: a browser session or a bearer token. */
			authMethod: 'session' | 'token' | null;
			/** Set when this request met an unreachable database; the answer is then a 503. */
			databaseUnreachable?: boolean;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
