import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { summariseArea } from '$lib/server/people/service';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	return { summary: await forPage(summariseArea(caller, 'admin')) };
};
