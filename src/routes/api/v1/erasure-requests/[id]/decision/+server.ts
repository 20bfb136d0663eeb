import { json } from '@sveltejs/kit';
import { erasureDecisionSchema } from '$lib/privacy/schemas';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId, readJson } from '$lib/server/http/api';
import { decideErasure, visibleErasureRequest } from '$lib/server/privacy/erasure';
import type { RequestHandler } from './$types';

/** { decision: "approve" | "decline", reason? }: approve erases; decline needs a reason (422). */
export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	// Another studio's request is not there (404) whatever the body says.
	await visibleErasureRequest(caller, id, 'erasure.read');
	const input = await readJson(event, erasureDecisionSchema);
	return json(await decideErasure(caller, id, input));
});
