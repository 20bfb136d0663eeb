import { json } from '@sveltejs/kit';
import { planPatchSchema } from '$lib/plans/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId, readJson } from '$lib/server/http/api';
import { getPlan, updatePlan } from '$lib/server/plans/service';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	return json(await getPlan(caller, readId(event.params.id)));
});

export const PATCH: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	const patch = await readJson(event, planPatchSchema);
	return json(await updatePlan(caller, id, patch));
});
