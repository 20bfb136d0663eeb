import { fail, redirect } from '@sveltejs/kit';
import { issuesToFormErrors } from '$lib/forms';
import { requestSignInLink } from '$lib/server/auth';
import { failForm } from '$lib/server/http/form';
import { safeCallbackUrl, signInForm } from '$lib/server/people/signin-form';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, url }) => {
	const callbackUrl = safeCallbackUrl(url.searchParams.get('callbackUrl'));
	if (locals.actor) redirect(303, callbackUrl);
	return {
		callbackUrl,
		email: (url.searchParams.get('email') ?? '').slice(0, 254),
		signedOut: url.searchParams.has('signedOut')
	};
};

export const actions: Actions = {
	default: async (event) => {
		const form = await event.request.formData();
		const values = {
			email: String(form.get('email') ?? '').slice(0, 300),
			callbackUrl: safeCallbackUrl(String(form.get('callbackUrl') ?? ''))
		};
		const parsed = signInForm.safeParse({ email: values.email });
		if (!parsed.success) {
			return failForm(values, issuesToFormErrors(parsed.error.issues));
		}
		const outcome = await requestSignInLink(event, parsed.data.email, values.callbackUrl);
		if (outcome === 'limited') {
			return fail(429, {
				values,
				errors: {
					form: 'Too many sign-in requests in the last 15 minutes. Please wait a little, then ask for a new link.'
				}
			});
		}
		redirect(303, '/signin/sent');
	}
};
