import { json } from '@sveltejs/kit';
import { clearanceSchema } from '$lib/clearance/schemas';
import { readClearance, setClearance } from '$lib/server/clearance/clearance';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId, readJson } from '$lib/server/http/api';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const view: Partial<Awaited<ReturnType<typeof readClearance>>> = await readClearance(
		caller,
		readId(event.params.id)
	);
	// Who is reading is the page's business, not the API's answer.
	delete view.viewer;
	return json(view);
});

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	const input = await readJson(event, clearanceSchema);
	return json(await setClearance(caller, id, input), { status: 201 });
});
