import { json } from '@sveltejs/kit';
import { consentRequestSchema } from '$lib/referrals/schemas';
import { requestConsent } from '$lib/server/consents/service';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readJson } from '$lib/server/http/api';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const input = await readJson(event, consentRequestSchema);
	return json(await requestConsent(caller, input), { status: 201 });
});
