import { json } from '@sveltejs/kit';
import { planCreateSchema, planListQuery } from '$lib/plans/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readJson, readQuery } from '$lib/server/http/api';
import { createPlan, listPlans } from '$lib/server/plans/service';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	return json(await listPlans(caller, readQuery(event.url, planListQuery)));
});

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const input = await readJson(event, planCreateSchema);
	const created = await createPlan(caller, input);
	return json(created, { status: 201, headers: { Location: `/api/v1/plans/${created.id}` } });
});
