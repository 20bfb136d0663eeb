import { requireApiCaller } from '$lib/server/context';
import { downloadLetter } from '$lib/server/documents/service';
import { pdfAttachment } from '$lib/server/documents/schemas';
import { apiHandler, readId } from '$lib/server/http/api';
import type { RequestHandler } from './$types';

/** The letter stored when the referral was sent, as stored. */
export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	return pdfAttachment(await downloadLetter(caller, readId(event.params.id)));
});
