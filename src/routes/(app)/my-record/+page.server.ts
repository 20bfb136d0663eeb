import { readClearance } from '$lib/server/clearance/clearance';
import { getOwnRecord } from '$lib/server/clients/service';
import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { listClientReferrals } from '$lib/server/referrals/for-client';
import { plansForMe } from '$lib/server/plans/service';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const record = await forPage(getOwnRecord(caller));
	const [clearance, inClass, referrals] = await Promise.all([
		forPage(readClearance(caller, record.client.id)),
		// What her ready class plans change for her: her own swaps and modifications only.
		forPage(plansForMe(caller)),
		forPage(listClientReferrals(caller, record.client.id))
	]);
	return { ...record, clearance, inClass, referrals };
};
