import { json } from '@sveltejs/kit';
import { homePracticeSchema } from '$lib/self-care/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId, readJson } from '$lib/server/http/api';
import { clientSelfCare, setHomePractice } from '$lib/server/self-care/service';
import type { RequestHandler } from './$types';

/** Her home practice with adherence, as her instructor sees it. */
export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const care = await clientSelfCare(caller, readId(event.params.id));
	return json(care.practice, { headers: { 'cache-control': 'no-store' } });
});

/** Give her a home practice, checked like a plan: 409 naming blocked items. */
export const PUT: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	const input = await readJson(event, homePracticeSchema);
	return json(await setHomePractice(caller, id, input));
});
