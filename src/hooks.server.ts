import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { randomUUID } from 'node:crypto';
import { config } from '$lib/server/config';

// Fail at start-up, naming the variable, rather than on the first request.
export const init: ServerInit = async () => {
	config();
};

/** Headers every response carries; the Content-Security-Policy comes from svelte.config.js. */
const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	const headers = response.headers;
	const set = (name: string, value: string) => {
		if (!headers.has(name)) headers.set(name, value);
	};
	try {
		set('X-Content-Type-Options', 'nosniff');
		set('Referrer-Policy', 'strict-origin-when-cross-origin');
		set('X-Frame-Options', 'DENY');
		set('Cross-Origin-Opener-Policy', 'same-origin');
		set('Permissions-Policy', 'camera=(), microphone=(), geolocation=(), payment=()');
		if (!headers.has('Content-Security-Policy')) {
			// Non-page responses (JSON, files) get a CSP that forbids everything active.
			set('Content-Security-Policy', "default-src 'none'; frame-ancestors 'none'");
		}
	} catch {
		// Some responses (redirects made by libraries) have immutable headers: copy them.
		return withHeaders(response);
	}
	return response;
};

function withHeaders(response: Response): Response {
	const copy = new Response(response.body, response);
	copy.headers.set('X-Content-Type-Options', 'nosniff');
	copy.headers.set('Referrer-Policy', 'strict-origin-when-cross-origin');
	copy.headers.set('X-Frame-Options', 'DENY');
	if (!copy.headers.has('Content-Security-Policy')) {
		copy.headers.set('Content-Security-Policy', "default-src 'none'; frame-ancestors 'none'");
	}
	return copy;
}

export const handle: Handle = sequence(securityHeaders);

/** Logs the error with an id and shows the person a plain message with that id — never a stack. */
export const handleError: HandleServerError = ({ error, event, status, message }) => {
	if (status === 404) return { message: 'Not found' };
	const errorId = randomUUID();
	console.error(`[error ${errorId}] ${event.request.method} ${event.url.pathname}`, error);
	return {
		message: status >= 500 ? 'Something went wrong on our side.' : message,
		errorId
	};
};
