import { redirect } from '@sveltejs/kit';
import { requestSignInLink } from '$lib/server/auth';
import { failFromProblem } from '$lib/server/http/form';
import { acceptInvitation, inspectInvitation } from '$lib/server/people/service';
import type { Actions, PageServerLoad } from './$types';

const tokenOf = (value: string) => value.slice(0, 200);

export const load: PageServerLoad = async ({ params, locals }) => {
	const invitation = await inspectInvitation(tokenOf(params.token));
	return {
		invitation,
		signedInAs: locals.actor?.email ?? null
	};
};

export const actions: Actions = {
	// Accepting makes the membership; then she signs in through the usual e-mail link.
	default: async (event) => {
		const token = tokenOf(event.params.token);
		let accepted: { email: string };
		try {
			accepted = await acceptInvitation(token, event.locals.actor, event.locals.access);
		} catch (e) {
			return failFromProblem(e);
		}
		if (event.locals.actor) redirect(303, '/start');
		await requestSignInLink(event, accepted.email, '/start');
		redirect(303, '/signin/sent');
	}
};
