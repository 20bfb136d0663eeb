import { json } from '@sveltejs/kit';
import { practiceSessionSchema } from '$lib/self-care/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readJson } from '$lib/server/http/api';
import { recordPracticeSession } from '$lib/server/self-care/service';
import type { RequestHandler } from './$types';

/** Mark a practice done: 201 { id, advice } (advice only when something felt wrong). */
export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const input = await readJson(event, practiceSessionSchema);
	return json(await recordPracticeSession(caller, input), { status: 201 });
});
