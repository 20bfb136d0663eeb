import { json } from '@sveltejs/kit';
import { practiceReminderSchema } from '$lib/self-care/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readJson } from '$lib/server/http/api';
import { setPracticeReminder } from '$lib/server/self-care/service';
import type { RequestHandler } from './$types';

/** Her opt-in to a practice reminder every 4 weeks: { on }. */
export const PUT: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const input = await readJson(event, practiceReminderSchema);
	return json(await setPracticeReminder(caller, input.on));
});
