// See https://svelte.dev/docs/kit/types#app.d.ts
import type { SessionUser } from '$lib/server/session';

declare global {
	namespace App {
		interface Error {
			message: string;
			/** Set on an unexpected error: the same id is in the server's log beside the stack. */
			errorId?: string;
		}
		interface Locals {
			/** The signed-in user, from the Auth.js session cookie or a personal access token; null when anonymous. */
			user: SessionUser | null;
			/** How the user was identified: a browser session or a bearer token. */
			authMethod: 'session' | 'token' | null;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
