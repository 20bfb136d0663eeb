import { json } from '@sveltejs/kit';
import { openReferralSchema, referralFilterSchema } from '$lib/referrals/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readJson, readQuery } from '$lib/server/http/api';
import { pageQuery } from '$lib/server/http/schemas';
import { listReferrals, openReferral } from '$lib/server/referrals/service';
import type { RequestHandler } from './$types';

const listQuery = referralFilterSchema.extend(pageQuery.shape);

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const query = readQuery(event.url, listQuery);
	// A page refreshing itself says so; its reads are logged only when what it shows changed.
	const background = event.request.headers.get('x-seamwell-background') === '1';
	return json(await listReferrals(caller, { ...query, background }));
});

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const input = await readJson(event, openReferralSchema);
	const created = await openReferral(caller, input);
	return json(created, { status: 201, headers: { Location: `/api/v1/referrals/${created.id}` } });
});
