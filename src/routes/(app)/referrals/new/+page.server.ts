import { error, fail, redirect } from '@sveltejs/kit';
import type { FormErrors } from '$lib/forms';
import { REFERRAL_WORDS, referralFromForm } from '$lib/referrals/form';
import { failForm, failFromProblem } from '$lib/server/http/form';
import { listClients } from '$lib/server/clients/service';
import { requirePageCaller } from '$lib/server/context';
import { ProblemError } from '$lib/server/http/problem';
import { mayOpenReferral } from '$lib/server/referrals/policy';
import { listClinics, openReferral } from '$lib/server/referrals/service';
import { notHere } from '$lib/server/referrals/not-here';
import type { Actions, PageServerLoad } from './$types';

const ROUTE = { type: 'route', id: '/(app)/referrals/new' };

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	if (!mayOpenReferral(caller.actor)) await notHere(caller, 'referral.created', ROUTE);
	try {
		const [clients, clinics] = await Promise.all([
			listClients(caller, { sort: 'name', limit: 100 }),
			listClinics(caller, { limit: 100 })
		]);
		return {
			clients: clients.items,
			clinics: clinics.items,
			chosenClient: url.searchParams.get('clientId') ?? ''
		};
	} catch (caught) {
		if (caught instanceof ProblemError && caught.slug === 'forbidden') error(404, 'Not found');
		throw caught;
	}
};

export const actions: Actions = {
	default: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		// Policy before parsing: someone who may not refer learns nothing from the form.
		if (!mayOpenReferral(caller.actor)) await notHere(caller, 'referral.created', ROUTE);
		const parsed = referralFromForm(await request.formData());
		if (!parsed.ok) return failForm(parsed.values, parsed.errors);
		let id: string;
		try {
			({ id } = await openReferral(caller, parsed.data));
		} catch (caught) {
			// Point to the referral she already has, so the instructor can open it instead.
			if (caught instanceof ProblemError && caught.slug === 'duplicate-referral') {
				return fail(409, {
					values: parsed.values,
					errors: { duplicateReason: caught.init.detail } as FormErrors,
					openReferralId: String(caught.init.openReferralId)
				});
			}
			return failFromProblem(caught, parsed.values, { words: REFERRAL_WORDS });
		}
		redirect(303, `/referrals/${id}`);
	}
};
