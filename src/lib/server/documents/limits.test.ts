import type { RequestEvent } from '@sveltejs/kit';
import { describe, expect, it } from 'vitest';
import {
	isUploadRequest,
	limitRequestBody,
	MAX_DOCUMENT_BYTES,
	MAX_OTHER_REQUEST_BYTES,
	MAX_UPLOAD_REQUEST_BYTES
} from './limits';

// The hooks' body-size cap: uploads up to 21 MB (a 20 MB document and its form), everything
// else 1 MB — Seamwell's own limits (common practice, no source).

const MB = 1024 * 1024;

function event(
	routeId: string,
	init: RequestInit & { search?: string; headers?: Record<string, string> }
) {
	const url = new URL(`http://127.0.0.1/x${init.search ?? ''}`);
	const request = new Request(url, { ...init, duplex: 'half' } as RequestInit);
	return { request, route: { id: routeId }, url } as unknown as RequestEvent;
}

/** Runs the handle; answers its response and the request the next handle saw (if any). */
async function run(e: RequestEvent) {
	let seen: Request | null = null;
	const response = await limitRequestBody({
		event: e,
		resolve: async (passed: RequestEvent) => {
			seen = passed.request;
			return new Response('ok');
		}
	} as Parameters<typeof limitRequestBody>[0]);
	return { response, seen: seen as Request | null };
}

function chunked(bytes: number): ReadableStream<Uint8Array> {
	let left = bytes;
	return new ReadableStream({
		pull(controller) {
			if (left <= 0) return controller.close();
			const size = Math.min(left, 64 * 1024);
			left -= size;
			controller.enqueue(new Uint8Array(size).fill(0x61));
		}
	});
}

describe('limits', () => {
	it('leaves room for a 20 MB document and its form, and caps everything else at 1 MB', () => {
		expect(MAX_DOCUMENT_BYTES).toBe(20 * MB);
		expect(MAX_UPLOAD_REQUEST_BYTES).toBe(21 * MB);
		expect(MAX_OTHER_REQUEST_BYTES).toBe(MB);
	});

	it('knows the two upload routes and nothing else', () => {
		const post = (id: string, search = '') => event(id, { method: 'POST', search, body: 'x' });
		expect(isUploadRequest(post('/api/v1/referrals/[id]/documents'))).toBe(true);
		expect(isUploadRequest(post('/(app)/referrals/[id]', '?/upload'))).toBe(true);
		expect(isUploadRequest(post('/(app)/referrals/[id]', '?/transition'))).toBe(false);
		expect(isUploadRequest(post('/api/v1/clients'))).toBe(false);
	});
});

describe('limitRequestBody', () => {
	it('answers 413 with a problem when a declared length is over the route’s limit', async () => {
		const { response, seen } = await run(
			event('/api/v1/clients', {
				method: 'POST',
				headers: { 'content-length': String(MB + 1), 'content-type': 'application/json' },
				body: 'x'
			})
		);
		expect(seen).toBeNull();
		expect(response.status).toBe(413);
		expect(response.headers.get('content-type')).toBe('application/problem+json');
		const body = (await response.json()) as { type: string; detail: string };
		expect(body.type).toBe('/problems/payload-too-large');
		expect(body.detail).toContain('1 MB');
	});

	it('lets an upload of up to 21 MB through, and says “nothing was saved” above it', async () => {
		const within = await run(
			event('/api/v1/referrals/[id]/documents', {
				method: 'POST',
				headers: { 'content-length': String(20.5 * MB) },
				body: 'x'
			})
		);
		expect(within.seen).not.toBeNull();
		const over = await run(
			event('/(app)/referrals/[id]', {
				method: 'POST',
				search: '?/upload',
				headers: { 'content-length': String(21 * MB + 1) },
				body: 'x'
			})
		);
		expect(over.response.status).toBe(413);
		expect(((await over.response.json()) as { detail: string }).detail).toContain(
			'Nothing was saved'
		);
	});

	it('reads a body without a declared length up to the limit, and refuses one past it', async () => {
		const small = await run(event('/api/v1/clients', { method: 'POST', body: chunked(MB - 10) }));
		expect(small.seen).not.toBeNull();
		expect((await small.seen!.arrayBuffer()).byteLength).toBe(MB - 10);
		const large = await run(event('/api/v1/clients', { method: 'POST', body: chunked(MB + 10) }));
		expect(large.seen).toBeNull();
		expect(large.response.status).toBe(413);
	});

	it('never looks at GET requests', async () => {
		const { seen } = await run(event('/api/v1/clients', { method: 'GET' }));
		expect(seen).not.toBeNull();
	});
});
