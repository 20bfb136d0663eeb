import { json } from '@sveltejs/kit';
import { followUpDoneSchema } from '$lib/self-care/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readJson } from '$lib/server/http/api';
import { assertMayFollowUp, markFollowedUp } from '$lib/server/self-care/service';
import type { RequestHandler } from './$types';

/** { kind: "self_check" | "felt_wrong", id }: the instructor has followed it up; it leaves her dashboard. */
export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	await assertMayFollowUp(caller);
	return json(await markFollowedUp(caller, await readJson(event, followUpDoneSchema)));
});
