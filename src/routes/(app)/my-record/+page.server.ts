import { getOwnRecord } from '$lib/server/clients/service';
import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { listClientReferrals } from '$lib/server/referrals/for-client';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const record = await forPage(getOwnRecord(caller));
	return { ...record, referrals: await forPage(listClientReferrals(caller, record.client.id)) };
};
