import { json } from '@sveltejs/kit';
import { withdrawConsent } from '$lib/server/consents/service';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId } from '$lib/server/http/api';
import type { RequestHandler } from './$types';

// Withdrawing takes no body: one POST, as easy as giving.
export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	return json(await withdrawConsent(caller, readId(event.params.id)));
});
