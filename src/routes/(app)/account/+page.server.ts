import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { requirePageCaller } from '$lib/server/context';
import { formFailure } from '$lib/server/people/forms';
import { ORGANISATION_COOKIE } from '$lib/server/people/sessions';
import { chooseOrganisation, describeMe } from '$lib/server/people/service';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	return { me: describeMe(caller), activeOrganisationId: caller.actor.activeOrganisationId };
};

const switchForm = z.object({ organisationId: z.uuid('Choose an organisation.') });

export const actions: Actions = {
	// Chooses the organisation she acts in; the cookie is checked against her memberships on every request.
	switch: async ({ locals, url, request, cookies }) => {
		const caller = requirePageCaller(locals, url);
		const form = await request.formData();
		const values = { organisationId: String(form.get('organisationId') ?? '') };
		const parsed = switchForm.safeParse(values);
		if (!parsed.success) {
			return fail(400, { values, errors: { organisationId: 'Choose an organisation.' } });
		}
		let organisationId: string;
		try {
			organisationId = chooseOrganisation(caller, parsed.data.organisationId);
		} catch (e) {
			return formFailure(e, values);
		}
		cookies.set(ORGANISATION_COOKIE, organisationId, {
			path: '/',
			httpOnly: true,
			sameSite: 'lax',
			secure: url.protocol === 'https:',
			maxAge: 60 * 60 * 24 * 365
		});
		redirect(303, '/start');
	}
};
