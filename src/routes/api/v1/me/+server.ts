import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler } from '$lib/server/http/api';
import { describeMe } from '$lib/server/people/service';
import type { RequestHandler } from './$types';

/** The signed-in person: { id, email, name, memberships, clientId }. */
export const GET: RequestHandler = apiHandler(({ locals }) => {
	const caller = requireApiCaller(locals);
	return json(describeMe(caller), { headers: { 'cache-control': 'no-store' } });
});
