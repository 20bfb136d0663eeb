import { json } from '@sveltejs/kit';
import { requireApiCaller } from '$lib/server/context';
import { listDocuments, uploadDocument } from '$lib/server/documents/service';
import { readUploadForm } from '$lib/server/documents/schemas';
import { apiHandler, readId, readQuery } from '$lib/server/http/api';
import { ProblemError } from '$lib/server/http/problem';
import { pageQuery } from '$lib/server/http/schemas';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	return json(await listDocuments(caller, id, readQuery(event.url, pageQuery)));
});

/** multipart/form-data: `file` (a PDF), `share` (clinic | studio), optional `summary`. */
export const POST: RequestHandler = apiHandler(
	async (event) => {
		const caller = requireApiCaller(event.locals);
		const id = readId(event.params.id);
		let form: FormData;
		try {
			form = await event.request.formData();
		} catch (cause) {
			if ((cause as { status?: number }).status === 413) {
				throw new ProblemError('payload-too-large', {
					detail: 'The upload is larger than this server accepts. Nothing was saved.'
				});
			}
			throw new ProblemError('validation-failed', {
				detail: 'The request is not a readable multipart form. Nothing was saved.',
				errors: [{ pointer: '/file', message: 'send the file as multipart/form-data' }]
			});
		}
		const parsed = await readUploadForm(form);
		if (!parsed.ok) {
			throw new ProblemError('validation-failed', {
				detail: `Nothing was saved: ${parsed.errors.map((e) => `${e.pointer} ${e.message}`).join('; ')}.`,
				errors: parsed.errors
			});
		}
		const created = await uploadDocument(caller, id, parsed.data);
		return json(created, {
			status: 201,
			headers: { Location: `/api/v1/documents/${created.id}` }
		});
	},
	{ accepts: ['multipart'] }
);
