import { requirePageCaller } from '$lib/server/context';
import { forPage, pageId } from '$lib/server/http/page';
import { checkPlanById, exerciseLibrary, getPlan } from '$lib/server/plans/service';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const caller = requirePageCaller(locals, url);
	const id = pageId(params.id);
	const plan = await forPage(getPlan(caller, id));
	const [check, library] = await Promise.all([
		forPage(checkPlanById(caller, id)),
		forPage(exerciseLibrary(caller))
	]);
	return { plan, check, library };
};
