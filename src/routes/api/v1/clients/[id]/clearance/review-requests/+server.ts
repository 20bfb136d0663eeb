import { json } from '@sveltejs/kit';
import { reviewRequestSchema } from '$lib/plans/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId, readJson } from '$lib/server/http/api';
import { requestClearanceReview } from '$lib/server/plans/service';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const clientId = readId(event.params.id);
	const input = await readJson(event, reviewRequestSchema);
	return json(await requestClearanceReview(caller, clientId, input), { status: 201 });
});
