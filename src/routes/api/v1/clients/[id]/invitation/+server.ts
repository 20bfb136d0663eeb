import { json } from '@sveltejs/kit';
import { inviteClientToSignIn } from '$lib/server/clients/service';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId } from '$lib/server/http/api';
import type { RequestHandler } from './$types';

/** POST with an empty JSON body: invites the client to sign in (a mail through the outbox). */
export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	return json(await inviteClientToSignIn(caller, id), { status: 202 });
});
