import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { downloadDocument, updateDocument } from '$lib/server/documents/service';
import { documentPatchSchema, pdfAttachment } from '$lib/server/documents/schemas';
import { apiHandler, readId, readJson } from '$lib/server/http/api';
import type { RequestHandler } from './$types';

/** The document, stamped on every page with who downloaded it and when. */
export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	return pdfAttachment(await downloadDocument(caller, readId(event.params.id)));
});

/** `{ share?: 'clinic' | 'studio', summary?: string | null }` */
export const PATCH: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	const patch = await readJson(event, documentPatchSchema);
	return json(await updateDocument(caller, id, patch));
});
