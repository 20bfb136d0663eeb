import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler } from '$lib/server/http/api';
import { verifyAccessLog } from '$lib/server/audit/review/service';
import type { RequestHandler } from './$types';

// A POST with no body needs no content type; one with a body must send JSON.
export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	return json(await verifyAccessLog(caller));
});
