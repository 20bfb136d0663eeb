import { json } from '@sveltejs/kit';
import { erasureListQuery } from '$lib/privacy/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readQuery } from '$lib/server/http/api';
import { listErasureRequests } from '$lib/server/privacy/erasure';
import type { RequestHandler } from './$types';

/** The studio admin's list: her studios' requests, open ones first, soonest due first. */
export const GET: RequestHandler = apiHandler(async ({ locals, url }) => {
	const caller = requireApiCaller(locals);
	return json({ items: await listErasureRequests(caller, readQuery(url, erasureListQuery)) });
});
