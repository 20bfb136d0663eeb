import { practiceSessionSchema } from '$lib/self-care/schemas';
import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { failForm, failFromProblem } from '$lib/server/http/form';
import {
	getOwnHomePractice,
	recordPracticeSession,
	setPracticeReminder
} from '$lib/server/self-care/service';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	return { practice: await forPage(getOwnHomePractice(caller)) };
};

// Plain form posts, so marking a practice done works without JavaScript too (the JSON API,
// POST /api/v1/me/home-practice/sessions, does the same for other clients).
export const actions: Actions = {
	done: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		const form = await request.formData();
		const feltOk = form.get('feltOk') === 'true';
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
		const on = (await request.formData()).get('on') === 'true';
		try {
			await setPracticeReminder(caller, on);
			return { reminderSaved: true };
		} catch (caught) {
			return failFromProblem(caught);
		}
	}
};
