import { error, fail } from '@sveltejs/kit';
import { ProblemError } from '../http/problem';

// The referral page's document forms call the same service functions as the API; this turns
// a service's problem into what the form shows: one message beside the documents.

export interface DocumentFormResult {
	documents: { message: string; ok: boolean };
}

export function documentFailure(caught: unknown) {
	if (!(caught instanceof ProblemError)) throw caught;
	if (caught.slug === 'not-found') error(404, 'Not found');
	const status = caught.slug === 'validation-failed' ? 400 : caught.toResponse().status;
	return fail(status, { documents: { message: caught.init.detail, ok: false } });
}

export function documentSuccess(message: string): DocumentFormResult {
	return { documents: { message, ok: true } };
}
