// See https://svelte.dev/docs/kit/types#app.d.ts
import type { Actor } from '$lib/server/actor';

declare global {
	namespace App {
		interface Error {
			message: string;
			errorId?: string;
		}
		interface Locals {
			/** The signed-in person with memberships, or null for anonymous requests. */
			actor: Actor | null;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
