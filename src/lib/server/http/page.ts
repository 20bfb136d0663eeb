import { error } from '@sveltejs/kit';
import { PROBLEM_TYPES, ProblemError } from './problem';
import { readId } from './api';

// Pages call the same services as the JSON API; these turn a service's problem into the
// designed error page. (Form actions use http/form.ts for inline errors.)

/** Runs a page's service call; a problem (not found, forbidden …) becomes SvelteKit's error page. */
export async function forPage<T>(work: Promise<T> | (() => Promise<T> | T)): Promise<T> {
	try {
		return await (typeof work === 'function' ? work() : work);
	} catch (e) {
		if (e instanceof ProblemError) {
			error(e.init.status ?? PROBLEM_TYPES[e.slug].status, e.init.detail);
		}
		throw e;
	}
}

/**
 * A record id from the page's path: one that is not a UUID names nothing, so the page is the
 * designed 404 (hooks.server.ts records the refusal, like any other 404 to a signed-in person).
 */
export function pageId(raw: string): string {
	try {
		return readId(raw);
	} catch {
		error(404, 'Not found');
	}
}
