import { json } from '@sveltejs/kit';
import { clientPatchSchema } from '$lib/clients/schemas';
import { getClient, updateClient } from '$lib/server/clients/service';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId, readJson } from '$lib/server/http/api';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	return json(await getClient(caller, readId(event.params.id)));
});

export const PATCH: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	const patch = await readJson(event, clientPatchSchema);
	return json(await updateClient(caller, id, patch));
});
