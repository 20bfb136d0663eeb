import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId } from '$lib/server/http/api';
import { listClientSelfChecks } from '$lib/server/self-care/service';
import type { RequestHandler } from './$types';

/** Her self-checks, marked self-reported: 404 unless she shares them with this studio. */
export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const items = await listClientSelfChecks(caller, readId(event.params.id));
	return json({ items }, { headers: { 'cache-control': 'no-store' } });
});
