import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { listOwnSelfChecks } from '$lib/server/self-care/service';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	return { setup: await forPage(listOwnSelfChecks(caller)) };
};
