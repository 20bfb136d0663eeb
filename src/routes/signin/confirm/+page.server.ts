import { CALLBACK_PATH } from '$lib/server/auth';
import { inspectSignInLink } from '$lib/server/people/sessions';
import type { PageServerLoad } from './$types';

// Opening the mail's link uses nothing up: only pressing the button (a POST to Auth.js's
// callback with the same query) signs in, so a mail scanner fetching the link is harmless.
export const load: PageServerLoad = async ({ url }) => {
	const email = (url.searchParams.get('email') ?? '').slice(0, 254);
	const token = (url.searchParams.get('token') ?? '').slice(0, 200);
	const callbackUrl = url.searchParams.get('callbackUrl') ?? '/start';
	const state = await inspectSignInLink(email, token);
	const query = new URLSearchParams({ callbackUrl, token, email });
	return {
		state,
		email,
		action: state === 'valid' ? `${CALLBACK_PATH}?${query}` : null
	};
};
