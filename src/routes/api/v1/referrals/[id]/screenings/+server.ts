import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId, readQuery } from '$lib/server/http/api';
import { pageQuery } from '$lib/server/http/schemas';
import { listLiveScreenings } from '$lib/server/referrals/service';
import type { RequestHandler } from './$types';

// The client's live screening history, for the clinic only while her consent lasts.
export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	return json(await listLiveScreenings(caller, id, readQuery(event.url, pageQuery)));
});
