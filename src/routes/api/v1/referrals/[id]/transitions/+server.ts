import { json } from '@sveltejs/kit';
import { transitionSchema } from '$lib/referrals/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId, readJson } from '$lib/server/http/api';
import { transitionReferral } from '$lib/server/referrals/service';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	const input = await readJson(event, transitionSchema);
	return json(await transitionReferral(caller, id, input));
});
