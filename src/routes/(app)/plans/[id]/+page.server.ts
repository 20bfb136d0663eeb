import { requirePageCaller } from '$lib/server/context';
import { forPage, pageId } from '$lib/server/http/page';
import { listClients } from '$lib/server/clients/service';
import { checkPlanById, exerciseLibrary, getPlan } from '$lib/server/plans/service';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const caller = requirePageCaller(locals, url);
	const id = pageId(params.id);
	const plan = await forPage(getPlan(caller, id));
	const [check, library, roster] = await Promise.all([
		forPage(checkPlanById(caller, id)),
		forPage(exerciseLibrary(caller)),
		forPage(listClients(caller, { sort: 'name', limit: 100 }))
	]);
	return {
		plan,
		check,
		library,
		roster: roster.items.map((c) => ({ id: c.id, name: c.name }))
	};
};
