import { json } from '@sveltejs/kit';
import { screeningInputSchema } from '$lib/clients/schemas';
import { listScreenings, recordScreening } from '$lib/server/clients/service';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId, readJson, readQuery } from '$lib/server/http/api';
import { pageQuery } from '$lib/server/http/schemas';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	return json(await listScreenings(caller, id, readQuery(event.url, pageQuery)));
});

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	const input = await readJson(event, screeningInputSchema);
	const recorded = await recordScreening(caller, id, input);
	return json(
		{
			id: recorded.id,
			outcome: recorded.outcome,
			reasons: recorded.reasons,
			warnings: recorded.warnings
		},
		{ status: 201 }
	);
});
