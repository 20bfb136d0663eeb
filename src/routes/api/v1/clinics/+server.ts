import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readQuery } from '$lib/server/http/api';
import { pageQuery } from '$lib/server/http/schemas';
import { listClinics } from '$lib/server/referrals/service';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	return json(await listClinics(caller, readQuery(event.url, pageQuery)));
});
