import { practiceSessionSchema } from '$lib/self-care/schemas';
import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { failForm, failFromProblem } from '$lib/server/http/form';
import { notHere } from '$lib/server/referrals/not-here';
import { mayUseOwnSelfCare } from '$lib/server/self-care/policy';
import {
	getOwnHomePractice,
	recordPracticeSession,
	setPracticeReminder
} from '$lib/server/self-care/service';
import type { Actions, PageServerLoad } from './$types';

const ROUTE = { type: 'route', id: '/(app)/practice' };

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	return { practice: await forPage(getOwnHomePractice(caller)) };
};

// Plain form posts, so marking a practice done works without JavaScript too (the JSON API,
// POST /api/v1/me/home-practice/sessions, does the same for other clients).
export const actions: Actions = {
	done: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		// Her own page: for anyone else it is not there (logged).
		if (!mayUseOwnSelfCare(caller.actor)) {
			await notHere(caller, 'home_practice.session_recorded', ROUTE);
		}
		const form = await request.formData();
		const answer = form.get('feltOk');
		// A post without the answer is not this page's form: nothing is recorded.
		if (answer !== 'true' && answer !== 'false') {
			return failForm({}, { form: 'Choose whether it felt fine, then save again.' });
		}
		const feltOk = answer === 'true';
		const note = String(form.get('note') ?? '').trim();
		const parsed = practiceSessionSchema.safeParse({
			doneAt: new Date().toISOString(),
			feltOk,
			note: note || null,
			symptoms: feltOk ? [] : form.getAll('symptoms').map(String)
		});
		if (!parsed.success) {
			return failForm({}, { form: 'Tick what you noticed from the list, then save again.' });
		}
		try {
			const saved = await recordPracticeSession(caller, parsed.data);
			return {
				done: feltOk ? 'Marked done. Well done!' : 'Marked done, with what felt wrong.',
				advice: saved.advice ?? null
			};
		} catch (caught) {
			return failFromProblem(caught);
		}
	},
	reminder: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		if (!mayUseOwnSelfCare(caller.actor)) {
			await notHere(caller, 'home_practice.reminder_changed', ROUTE);
		}
		const choice = (await request.formData()).get('on');
		if (choice !== 'true' && choice !== 'false') {
			return failForm({}, { form: 'Choose to start or stop the reminder, then save again.' });
		}
		const on = choice === 'true';
		try {
			await setPracticeReminder(caller, on);
			return { reminderSaved: true };
		} catch (caught) {
			return failFromProblem(caught);
		}
	}
};
