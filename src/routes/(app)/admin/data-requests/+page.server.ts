import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { listErasureRequests } from '$lib/server/privacy/erasure';
import { notHere } from '$lib/server/referrals/not-here';
import type { PageServerLoad } from './$types';
import { studioAdminIds } from '$lib/server/scope';

// The studio admin's data requests: clients' requests to erase their data, open ones first
// (soonest due first, overdue ones flagged), then the answered ones.
export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	// Only a studio's admins answer these; for anyone else the page is not there.
	if (studioAdminIds(caller.actor).length === 0) {
		await notHere(caller, 'erasure.listed', { type: 'route', id: '/(app)/admin/data-requests' });
	}
	return { requests: await forPage(listErasureRequests(caller)) };
};
