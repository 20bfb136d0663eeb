import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler } from '$lib/server/http/api';
import { getOwnHomePractice } from '$lib/server/self-care/service';
import type { RequestHandler } from './$types';

/** Her home practice: cards with cue, stop signs, modifications and paused flags. */
export const GET: RequestHandler = apiHandler(async ({ locals }) => {
	const caller = requireApiCaller(locals);
	const practice = await getOwnHomePractice(caller);
	return json(
		{ items: practice.items, updatedAt: practice.updatedAt, reminder: practice.reminder },
		{ headers: { 'cache-control': 'no-store' } }
	);
});
