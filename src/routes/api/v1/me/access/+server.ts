import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readQuery } from '$lib/server/http/api';
import { pageQuery } from '$lib/server/http/schemas';
import { listOwnAccess } from '$lib/server/privacy/access';
import type { RequestHandler } from './$types';

/** Who accessed the signed-in client's record: { items: [{ at, actor, action, label, outcome }], nextCursor }. */
export const GET: RequestHandler = apiHandler(async ({ locals, url }) => {
	const caller = requireApiCaller(locals);
	return json(await listOwnAccess(caller, readQuery(url, pageQuery)));
});
