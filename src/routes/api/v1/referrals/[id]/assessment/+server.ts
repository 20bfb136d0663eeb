import { json } from '@sveltejs/kit';
import { assessmentSchema } from '$lib/clearance/schemas';
import { readAssessment, recordAssessment } from '$lib/server/clearance/assessment';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId, readJson } from '$lib/server/http/api';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	return json(await readAssessment(caller, readId(event.params.id)));
});

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	const input = await readJson(event, assessmentSchema);
	const saved = await recordAssessment(caller, id, input);
	return json({ id: saved.id }, { status: 201 });
});
