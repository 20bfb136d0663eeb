import { listClearanceReviews } from '$lib/server/clearance/reviews';
import { requirePageCaller } from '$lib/server/context';
import { countClients } from '$lib/server/clients/service';
import { forPage } from '$lib/server/http/page';
import { summariseArea } from '$lib/server/people/service';
import { listPlans } from '$lib/server/plans/service';
import { countReferrals, RECENT_ANSWER_DAYS } from '$lib/server/referrals/service';
import { listFollowUps, markFollowedUp } from '$lib/server/self-care/service';
import { followUpDoneSchema } from '$lib/self-care/schemas';
import { failFromProblem } from '$lib/server/http/form';
import { fail } from '@sveltejs/kit';
import { mayFollowUp } from '$lib/server/self-care/policy';
import { notHere } from '$lib/server/referrals/not-here';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	// The area first: someone who is no instructor gets the 404 before anything is counted.
	const summary = await forPage(summariseArea(caller, 'instructor'));
	const [clients, referrals, reviews, followUps, plans] = await forPage(
		Promise.all([
			countClients(caller),
			countReferrals(caller),
			listClearanceReviews(caller),
			listFollowUps(caller),
			listPlans(caller, { limit: 4 })
		])
	);
	return {
		summary,
		clients,
		referrals,
		reviews,
		followUps,
		plans: plans.items,
		recentDays: RECENT_ANSWER_DAYS
	};
};

export const actions: Actions = {
	// "Followed up": the item leaves the dashboard for every instructor of the studio (logged).
	followedUp: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		if (!mayFollowUp(caller.actor)) {
			await notHere(caller, 'self_check.followed_up', { type: 'route', id: '/(app)/instructor' });
		}
		const form = await request.formData();
		const values = { kind: String(form.get('kind') ?? ''), id: String(form.get('id') ?? '') };
		const parsed = followUpDoneSchema.safeParse(values);
		if (!parsed.success) {
			return fail(400, { values, errors: { form: 'That follow-up could not be found.' } });
		}
		try {
			await markFollowedUp(caller, parsed.data);
		} catch (caught) {
			return failFromProblem(caught, values);
		}
		return { followedUp: parsed.data.id };
	}
};
