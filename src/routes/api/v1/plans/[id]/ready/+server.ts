import { json } from '@sveltejs/kit';
import { readySchema } from '$lib/plans/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId, readJson } from '$lib/server/http/api';
import { markReady } from '$lib/server/plans/service';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	const input = await readJson(event, readySchema);
	return json(await markReady(caller, id, input.override));
});
