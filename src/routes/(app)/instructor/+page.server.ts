import { listClearanceReviews } from '$lib/server/clearance/reviews';
import { requirePageCaller } from '$lib/server/context';
import { countClients } from '$lib/server/clients/service';
import { forPage } from '$lib/server/http/page';
import { summariseArea } from '$lib/server/people/service';
import { listPlans } from '$lib/server/plans/service';
import { countReferrals, RECENT_ANSWER_DAYS } from '$lib/server/referrals/service';
import { listFollowUps } from '$lib/server/self-care/service';
import type { PageServerLoad } from './$types';

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
