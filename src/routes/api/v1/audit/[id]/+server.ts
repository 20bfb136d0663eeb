import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler } from '$lib/server/http/api';
import { notFound } from '$lib/server/http/problem';
import { getAccessEvent } from '$lib/server/audit/review/service';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = Number(event.params.id);
	if (!/^[1-9]\d{0,17}$/.test(event.params.id)) throw notFound();
	return json(await getAccessEvent(caller, id));
});
