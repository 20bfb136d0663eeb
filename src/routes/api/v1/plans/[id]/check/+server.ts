import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId } from '$lib/server/http/api';
import { checkPlanById } from '$lib/server/plans/service';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	return json(await checkPlanById(caller, readId(event.params.id)));
});
