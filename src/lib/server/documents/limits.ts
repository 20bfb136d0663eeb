import type { Handle, RequestEvent } from '@sveltejs/kit';
import { problem } from '../http/problem';
import { DEFAULT_PDF_LIMITS } from './pdf-check';

// How big a request may be. A document may be 20 MB and 200 pages (DEFAULT_PDF_LIMITS, also
// checked by the database); its upload request carries the multipart framing and the form's
// other fields besides, so the two upload routes accept up to 1 MB more. adapter-node's own
// cap, BODY_SIZE_LIMIT (scripts/lib/env.mjs), is set to that same figure; every other route
// is capped much lower here, before any handler reads a byte, with a 413 problem that says so.

const MB = 1024 * 1024;

export const MAX_DOCUMENT_BYTES = DEFAULT_PDF_LIMITS.maxBytes;
export const MAX_DOCUMENT_PAGES = DEFAULT_PDF_LIMITS.maxPages;
export const MAX_UPLOAD_REQUEST_BYTES = MAX_DOCUMENT_BYTES + MB;
export const MAX_OTHER_REQUEST_BYTES = MB;

/** The API's upload endpoint and the referral page's upload form action. */
export function isUploadRequest(event: Pick<RequestEvent, 'request' | 'route' | 'url'>): boolean {
	if (event.request.method !== 'POST') return false;
	if (event.route.id === '/api/v1/referrals/[id]/documents') return true;
	return event.route.id === '/(app)/referrals/[id]' && event.url.search === '?/upload';
}

const megabytes = (bytes: number) => `${Math.round(bytes / MB)} MB`;

function tooLarge(upload: boolean, limit: number): Response {
	return problem('payload-too-large', {
		detail: upload
			? `The upload is larger than ${megabytes(limit)}; a document may be at most ${megabytes(MAX_DOCUMENT_BYTES)}. Nothing was saved.`
			: `The request body is larger than ${megabytes(limit)}, the most this address accepts.`,
		limit
	});
}

/** The whole stream if it holds at most `limit` bytes; null (and the stream cancelled) past it. */
async function readAtMost(stream: ReadableStream<Uint8Array>, limit: number) {
	const reader = stream.getReader();
	const chunks: Uint8Array[] = [];
	let size = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		size += value.length;
		if (size > limit) {
			await reader.cancel();
			return null;
		}
		chunks.push(value);
	}
	return Buffer.concat(chunks, size);
}

/**
 * The hooks' body-size cap. A declared Content-Length over the route's limit is answered at
 * once; a body sent without one (chunked) is read here up to the limit, so it cannot grow
 * past it either, and handed on as it came.
 */
export const limitRequestBody: Handle = async ({ event, resolve }) => {
	const { request } = event;
	if (request.method === 'GET' || request.method === 'HEAD') return resolve(event);
	const upload = isUploadRequest(event);
	const limit = upload ? MAX_UPLOAD_REQUEST_BYTES : MAX_OTHER_REQUEST_BYTES;
	const declared = request.headers.get('content-length');
	if (declared !== null) {
		return Number(declared) > limit ? tooLarge(upload, limit) : resolve(event);
	}
	if (request.body === null) return resolve(event);
	const body = await readAtMost(request.body, limit);
	if (body === null) return tooLarge(upload, limit);
	const headers = new Headers(request.headers);
	headers.delete('transfer-encoding');
	event.request = new Request(request.url, {
		method: request.method,
		headers,
		body,
		signal: request.signal
	});
	return resolve(event);
};
