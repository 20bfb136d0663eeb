// The upload with a progress bar, loaded when the physiotherapist sends a document (the page
// needs none of it before). XMLHttpRequest, not fetch: only it reports the upload's progress.

export type UploadAnswer = { ok: true } | { ok: false; detail: string | null };

/**
 * Posts the form's fields to the JSON API; `progress` hears the percent sent so far. Rejects
 * when the request never reached the server.
 */
export function sendDocument(
	url: string,
	body: FormData,
	progress: (percent: number) => void
): Promise<UploadAnswer> {
	return new Promise((done, fail) => {
		const request = new XMLHttpRequest();
		request.open('POST', url);
		request.setRequestHeader('accept', 'application/json');
		request.upload.addEventListener('progress', (event) => {
			if (event.lengthComputable) progress(Math.round((event.loaded / event.total) * 100));
		});
		request.addEventListener('load', () => {
			if (request.status === 201) return done({ ok: true });
			let detail: string | null = null;
			try {
				detail = (JSON.parse(request.responseText) as { detail?: string }).detail ?? null;
			} catch {
				// Not a problem document (a proxy's page, say): the caller keeps its plain message.
			}
			done({ ok: false, detail });
		});
		request.addEventListener('error', () => fail(new Error('the upload did not reach the server')));
		request.send(body);
	});
}
