import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler } from '$lib/server/http/api';
import { notFound } from '$lib/server/http/problem';
import { getAccessEvent } from '$lib/server/audit/review/service';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	// Event ids are the log's row numbers; anything else names no event.
	const raw = event.params.id ?? '';
	if (!/^[1-9]\d{0,14}$/.test(raw)) throw notFound();
	return json(await getAccessEvent(caller, Number(raw)));
});
