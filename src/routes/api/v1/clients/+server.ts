import { json } from '@sveltejs/kit';
import { clientCreateSchema, clientListFilterSchema } from '$lib/clients/schemas';
import { createClient, listClients } from '$lib/server/clients/service';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readJson, readQuery } from '$lib/server/http/api';
import { pageQuery } from '$lib/server/http/schemas';
import type { RequestHandler } from './$types';

const listQuery = clientListFilterSchema.extend(pageQuery.shape);

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const query = readQuery(event.url, listQuery);
	return json(await listClients(caller, query));
});

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const input = await readJson(event, clientCreateSchema);
	const created = await createClient(caller, input);
	return json(created, {
		status: 201,
		headers: { Location: `/api/v1/clients/${created.id}` }
	});
});
