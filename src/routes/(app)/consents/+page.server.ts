import { z } from 'zod';
import { CONSENT_WORDS, consentFromForm } from '$lib/referrals/form';
import { failForm, failFromProblem } from '$lib/server/http/form';
import { getConsentOverview, giveConsent, withdrawConsent } from '$lib/server/consents/service';
import { requirePageCaller } from '$lib/server/context';
import { mayGiveConsent } from '$lib/server/consents/policy';
import { readId } from '$lib/server/http/api';
import { notHere } from '$lib/server/referrals/not-here';
import type { Actions, PageServerLoad } from './$types';

const ROUTE = { type: 'route', id: '/(app)/consents' };
const isUuid = (value: string) => z.uuid().safeParse(value).success;

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	// The page is the client's own: for anyone else it is not there.
	if (!mayGiveConsent(caller.actor)) await notHere(caller, 'consent.read', ROUTE);
	return {
		overview: await getConsentOverview(caller),
		requestId: url.searchParams.get('request')
	};
};

export const actions: Actions = {
	give: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		if (!mayGiveConsent(caller.actor)) await notHere(caller, 'consent.given', ROUTE);
		const parsed = consentFromForm(await request.formData());
		if (!parsed.ok) return failForm(parsed.values, parsed.errors);
		try {
			await giveConsent(caller, parsed.data);
		} catch (caught) {
			return failFromProblem(caught, parsed.values, { words: CONSENT_WORDS });
		}
		return { given: parsed.data.clinicId };
	},
	withdraw: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		if (!mayGiveConsent(caller.actor)) await notHere(caller, 'consent.withdrawn', ROUTE);
		const form = await request.formData();
		const raw = String(form.get('id') ?? '');
		if (!isUuid(raw)) await notHere(caller, 'consent.withdrawn', { type: 'consent', id: raw });
		try {
			const id = readId(raw);
			await withdrawConsent(caller, id);
		} catch (caught) {
			return failFromProblem(caught);
		}
		return { withdrawn: true };
	}
};
