import { listClearanceReviews } from '$lib/server/clearance/reviews';
import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { listReviewRequests } from '$lib/server/plans/service';
import { summariseArea } from '$lib/server/people/service';
import { countReferrals } from '$lib/server/referrals/service';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	// The area first: someone who is no physiotherapist gets the 404 before anything is counted.
	const summary = await forPage(summariseArea(caller, 'physiotherapist'));
	const [referrals, reviews, reviewRequests] = await forPage(
		Promise.all([countReferrals(caller), listClearanceReviews(caller), listReviewRequests(caller)])
	);
	return { summary, referrals, reviews, reviewRequests };
};
