import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler } from '$lib/server/http/api';
import { listOwnErasureRequests, requestErasure } from '$lib/server/privacy/erasure';
import type { RequestHandler } from './$types';

/** Her own requests to erase her data, newest first. */
export const GET: RequestHandler = apiHandler(async ({ locals }) => {
	const caller = requireApiCaller(locals);
	return json({ items: await listOwnErasureRequests(caller) });
});

/** Asks her studio to erase her data: 201 { id, dueOn }; 409 while one is open. No body. */
export const POST: RequestHandler = apiHandler(async ({ locals }) => {
	const caller = requireApiCaller(locals);
	const created = await requestErasure(caller);
	return json(created, {
		status: 201,
		headers: { Location: `/api/v1/me/erasure-requests/${created.id}` }
	});
});
