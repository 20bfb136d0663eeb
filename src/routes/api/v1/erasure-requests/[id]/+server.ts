import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId } from '$lib/server/http/api';
import { getErasureRequest } from '$lib/server/privacy/erasure';
import type { RequestHandler } from './$types';

/** One request and, while open, what approving it would erase and what the clinics keep. */
export const GET: RequestHandler = apiHandler(async ({ locals, params }) => {
	const caller = requireApiCaller(locals);
	return json(await getErasureRequest(caller, readId(params.id)));
});
