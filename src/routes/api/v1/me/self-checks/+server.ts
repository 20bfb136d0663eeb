import { json } from '@sveltejs/kit';
import { selfCheckInputSchema } from '$lib/self-care/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readJson } from '$lib/server/http/api';
import { listOwnSelfChecks, recordSelfCheck } from '$lib/server/self-care/service';
import type { RequestHandler } from './$types';

/** Her own self-checks, newest first, with whether she shares them. */
export const GET: RequestHandler = apiHandler(async ({ locals }) => {
	const caller = requireApiCaller(locals);
	const setup = await listOwnSelfChecks(caller);
	return json(
		{
			items: setup.checks,
			sharing: { studioId: setup.studio.id, studioName: setup.studio.name, share: setup.shared }
		},
		{ headers: { 'cache-control': 'no-store' } }
	);
});

/** Record one self-check: 201 { id, advice: { level, text } }. */
export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const input = await readJson(event, selfCheckInputSchema);
	return json(await recordSelfCheck(caller, input), { status: 201 });
});
