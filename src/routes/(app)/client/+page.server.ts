import { requirePageCaller } from '$lib/server/context';
import { countOwnSharing } from '$lib/server/consents/service';
import { forPage } from '$lib/server/http/page';
import { summariseArea } from '$lib/server/people/service';
import { listClientReferrals } from '$lib/server/referrals/for-client';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const summary = await forPage(summariseArea(caller, 'client'));
	// Until her studio links her record she has no consents to count.
	const sharing = summary.clientId ? await forPage(countOwnSharing(caller)) : null;
	// Where her latest referral stands, so she need not open her record to find out.
	const [latestReferral] = summary.clientId
		? await forPage(listClientReferrals(caller, summary.clientId, { limit: 1 }))
		: [];
	return { summary, sharing, latestReferral: latestReferral ?? null };
};
