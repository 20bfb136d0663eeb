import { readClearance } from '$lib/server/clearance/clearance';
import { getOwnRecord } from '$lib/server/clients/service';
import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { plansForMe } from '$lib/server/plans/service';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const record = await forPage(getOwnRecord(caller));
	const clearance = await forPage(readClearance(caller, record.client.id));
	// What her ready class plans change for her: her own swaps and modifications only.
	const inClass = await forPage(plansForMe(caller));
	return { ...record, clearance, inClass };
};
