import { json } from '@sveltejs/kit';
import { exerciseCreateSchema, exerciseQuerySchema } from '$lib/plans/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readJson, readQuery } from '$lib/server/http/api';
import { createExercise, listExercises } from '$lib/server/plans/service';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const query = readQuery(event.url, exerciseQuerySchema);
	return json(await listExercises(caller, query));
});

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const input = await readJson(event, exerciseCreateSchema);
	return json(await createExercise(caller, input), { status: 201 });
});
