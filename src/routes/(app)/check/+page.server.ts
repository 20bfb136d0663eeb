import { formValues } from '$lib/forms';
import { selfCheckFromForm } from '$lib/self-care/check-form';
import { requirePageCaller } from '$lib/server/context';
import { failForm, failFromProblem, formDone } from '$lib/server/http/form';
import { forPage } from '$lib/server/http/page';
import { notHere } from '$lib/server/referrals/not-here';
import { mayUseOwnSelfCare } from '$lib/server/self-care/policy';
import {
	listOwnSelfChecks,
	recordSelfCheck,
	setSelfCheckSharing
} from '$lib/server/self-care/service';
import type { Actions, PageServerLoad } from './$types';

const ROUTE = { type: 'route', id: '/(app)/check' };

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	return { setup: await forPage(listOwnSelfChecks(caller)) };
};

// Plain form posts, so the self-check and the sharing choice work without JavaScript too (the
// JSON API, /api/v1/me/self-checks and /api/v1/me/self-check-sharing, does the same).
export const actions: Actions = {
	record: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		// Her own page: for anyone else it is not there (logged).
		if (!mayUseOwnSelfCare(caller.actor)) {
			await notHere(caller, 'self_check.recorded', ROUTE);
		}
		const values = formValues(await request.formData(), ['symptoms']);
		// A post without the form's own marker is not this page's form: nothing is recorded.
		if (values.form !== 'self-check') {
			return failForm(values, { form: 'Answer the questions, then save again.' });
		}
		const parsed = selfCheckFromForm(values, new Date());
		if (!parsed.ok) return failForm(values, parsed.errors);
		try {
			const saved = await recordSelfCheck(caller, parsed.data);
			return { advice: saved.advice, withSites: parsed.data.sites != null };
		} catch (caught) {
			return failFromProblem(caught, values, { words: { sites: { label: 'Finger widths' } } });
		}
	},
	sharing: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		if (!mayUseOwnSelfCare(caller.actor)) {
			await notHere(caller, 'self_check.sharing_changed', ROUTE);
		}
		const form = await request.formData();
		const share = form.get('share');
		if (share !== 'true' && share !== 'false') {
			return failForm(
				{},
				{ form: 'Choose to start or stop sharing, then save again.' },
				{ form: 'sharing' }
			);
		}
		try {
			const saved = await setSelfCheckSharing(caller, {
				studioId: String(form.get('studioId') ?? ''),
				share: share === 'true'
			});
			return formDone(
				saved.shared
					? 'Saved: your studio can see your self-checks.'
					: 'Saved: your self-checks are private again.',
				'sharing'
			);
		} catch (caught) {
			return failFromProblem(caught, {}, { form: 'sharing', rename: () => 'form' });
		}
	}
};
