// See https://svelte.dev/docs/kit/types#app.d.ts
import type { Actor } from '$lib/server/actor';
import type { AccessContext } from '$lib/server/audit';

declare global {
	namespace App {
		interface Error {
			message: string;
			errorId?: string;
		}
		interface Locals {
			/** The signed-in person with memberships, or null for anonymous requests. */
			actor: Actor | null;
			/** Who is asking and from where, for the access log (filled for every request). */
			access: AccessContext;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
