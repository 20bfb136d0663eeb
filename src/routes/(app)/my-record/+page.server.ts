import { orNotFound } from '$lib/server/clients/actions';
import { getOwnRecord } from '$lib/server/clients/service';
import { requirePageCaller } from '$lib/server/context';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	return orNotFound(getOwnRecord(caller));
};
