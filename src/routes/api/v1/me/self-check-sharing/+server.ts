import { json } from '@sveltejs/kit';
import { selfCheckSharingSchema } from '$lib/self-care/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readJson } from '$lib/server/http/api';
import { setSelfCheckSharing } from '$lib/server/self-care/service';
import type { RequestHandler } from './$types';

/** Her choice whether her studio sees her self-checks: { studioId, share }. */
export const PUT: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const input = await readJson(event, selfCheckSharingSchema);
	const result = await setSelfCheckSharing(caller, input);
	return json({ studioId: result.studioId, share: result.shared });
});
