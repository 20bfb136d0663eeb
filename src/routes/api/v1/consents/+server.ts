import { json } from '@sveltejs/kit';
import { giveConsentSchema } from '$lib/referrals/schemas';
import { giveConsent, listConsents } from '$lib/server/consents/service';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readJson, readQuery } from '$lib/server/http/api';
import { pageQuery } from '$lib/server/http/schemas';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	return json(await listConsents(caller, readQuery(event.url, pageQuery)));
});

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const input = await readJson(event, giveConsentSchema);
	const created = await giveConsent(caller, input);
	return json(created, { status: 201, headers: { Location: `/api/v1/consents/${created.id}` } });
});
