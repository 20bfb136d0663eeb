import {
	error,
	redirect,
	type Handle,
	type HandleFetch,
	type HandleServerError,
	type ServerInit
} from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { randomUUID } from 'node:crypto';
import {
	AUTH_BASE,
	CALLBACK_PATH,
	SIGNOUT_PATH,
	authHandle,
	sessionCookieName
} from '$lib/server/auth';
import type { AccessContext } from '$lib/server/audit';
import { config } from '$lib/server/config';
import { describeError, isDatabaseUnavailable } from '$lib/server/db/errors';
import { RETRY_AFTER_SECONDS, databaseUnavailable } from '$lib/server/http/api';
import {
	isCrossOriginChange,
	isMalformedPath,
	securityHeaderValues
} from '$lib/server/http/headers';
import { problem } from '$lib/server/http/problem';
import { decideRoute } from '$lib/server/people/policy';
import {
	ORGANISATION_COOKIE,
	accessRole,
	inspectSignInLink,
	linkLogId,
	recordSignInEvent,
	resolveSession,
	sessionOwner,
	signInTokenHash
} from '$lib/server/people/sessions';
import { hasRecordedRefusal, recordRefusal } from '$lib/server/audit';
import { limitRequestBody } from '$lib/server/documents/limits';
import { startBackgroundWorkers } from '$lib/server/workers';
import { closeDatabase } from '$lib/server/db';

let stopWorkers: (() => Promise<void>) | undefined;

// Fail at start-up, naming the variable, rather than on the first request; then start the
// mail outbox worker and the log sealer once per process.
export const init: ServerInit = async () => {
	config();
	stopWorkers ??= startBackgroundWorkers();
};

// On SIGTERM or SIGINT the Node adapter stops accepting requests, lets those in flight finish,
// then emits this event: finish the workers' current step and close the database pool, so the
// process ends by itself (a deploy or `npm start`'s restart need not wait for a SIGKILL).
async function shutDown(): Promise<void> {
	try {
		await stopWorkers?.();
		await closeDatabase();
	} catch (error) {
		console.error('[shutdown]', error);
	}
}
process.once('sveltekit:shutdown', () => void shutDown());

/**
 * Headers every response carries (the Content-Security-Policy of pages comes from
 * svelte.config.js): HSTS over https, and `Cache-Control: no-store` on every answer to a
 * signed-in person or one that sets or ends a session.
 */
const securityHeaders: Handle = async ({ event, resolve }) => {
	const cookieName = sessionCookieName(event.url);
	const hadSession = event.cookies.get(cookieName) !== undefined;
	let response = await resolve(event);
	const { defaults, force } = securityHeaderValues({
		https: event.url.protocol === 'https:',
		authenticated:
			hadSession ||
			event.locals.actor != null ||
			response.headers.getSetCookie().some((c) => c.startsWith(`${cookieName}=`))
	});
	try {
		applyHeaders(response.headers, defaults, force);
	} catch {
		// Some responses (redirects made by libraries) have immutable headers: copy them.
		response = new Response(response.body, response);
		applyHeaders(response.headers, defaults, force);
	}
	return response;
};

function applyHeaders(
	headers: Headers,
	defaults: Record<string, string>,
	force: Record<string, string>
): void {
	for (const [name, value] of Object.entries(defaults)) {
		if (!headers.has(name)) headers.set(name, value);
	}
	for (const [name, value] of Object.entries(force)) headers.set(name, value);
}

/** Requests whose answers were errors caused by a lost database (marked by handleError). */
const lostDatabase = new WeakSet<App.Locals>();

/**
 * While PostgreSQL is away (a restart, say) every request that needed it answers 503 with
 * Retry-After — problem+json for the API, the error page for people — instead of a 500; the
 * pool reconnects by itself as soon as the database accepts connections again. Nothing was
 * committed for such a request, so no acknowledged change is lost.
 */
const databaseOutage: Handle = async ({ event, resolve }) => {
	let response: Response;
	try {
		response = await resolve(event);
	} catch (error) {
		if (!isDatabaseUnavailable(error)) throw error;
		return outageAnswer(event.url, event.request);
	}
	if (!lostDatabase.has(event.locals)) return response;
	const headers = new Headers(response.headers);
	headers.set('Retry-After', String(RETRY_AFTER_SECONDS));
	return new Response(response.body, { status: 503, headers });
};

function outageAnswer(url: URL, request: Request): Response {
	const wantsHtml = (request.headers.get('accept') ?? '').includes('text/html');
	if (url.pathname.startsWith('/api/') || !wantsHtml) return databaseUnavailable(url.pathname);
	return new Response(
		'<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Back in a moment — Seamwell</title></head>' +
			'<body><h1>Back in a moment</h1><p>Seamwell cannot reach its database right now. Nothing was saved half-way. ' +
			'Please try again in a few seconds.</p></body></html>',
		{
			status: 503,
			headers: {
				'content-type': 'text/html; charset=utf-8',
				'Retry-After': String(RETRY_AFTER_SECONDS)
			}
		}
	);
}

/**
 * Refuses, before anything else reads the request: a change (any method but GET, HEAD,
 * OPTIONS) from another origin or with no Origin at all, whatever its content type (Auth.js's
 * sign-out included); and an address whose percent-encoding does not decode.
 */
const requestShape: Handle = async ({ event, resolve }) => {
	const api = event.url.pathname.startsWith('/api/');
	if (isMalformedPath(event.url.pathname) && api) {
		return problem('malformed-path', {
			detail: 'The address holds a percent-encoding that does not decode.'
		});
	}
	if (isCrossOriginChange(event.request, event.url.origin)) {
		const detail =
			'Changes must come from Seamwell itself: the Origin header is missing or foreign.';
		if (api) return problem('cross-origin', { detail, instance: event.url.pathname });
		return new Response(detail, { status: 403, headers: { 'content-type': 'text/plain' } });
	}
	// Outside the API a POST is a form (Seamwell's pages and Auth.js's): anything but form data
	// is refused here, before a form action tries to read it as one.
	if (!api && event.request.method === 'POST' && !isFormContent(event.request)) {
		return new Response(
			'Forms are sent as form data (application/x-www-form-urlencoded or multipart/form-data).',
			{
				status: 415,
				headers: { 'content-type': 'text/plain; charset=utf-8' }
			}
		);
	}
	if (!api && event.request.method === 'POST') {
		// A form whose body does not parse (a broken multipart boundary, say) is the sender's
		// error: 400 on the designed error page, not a 500 from inside the action.
		const request = event.request;
		const readForm = request.formData.bind(request);
		request.formData = async () => {
			try {
				return await readForm();
			} catch {
				error(400, 'The form could not be read. Please send it again.');
			}
		};
	}
	return resolve(event);
};

function isFormContent(request: Request): boolean {
	const type = (request.headers.get('content-type') ?? '').split(';')[0]!.trim().toLowerCase();
	return type === 'application/x-www-form-urlencoded' || type === 'multipart/form-data';
}

/** Who is asking and from where, for the access log: anonymous until the session is read. */
const accessContext: Handle = async ({ event, resolve }) => {
	let address: string | null = null;
	try {
		address = event.getClientAddress();
	} catch {
		// ADDRESS_HEADER set but missing from this request: log without an address.
	}
	const access: AccessContext = {
		userId: null,
		role: null,
		organisationId: null,
		address,
		userAgent: event.request.headers.get('user-agent')
	};
	event.locals.access = access;
	event.locals.actor = null;
	return resolve(event);
};

const seeOther = (location: string) => new Response(null, { status: 303, headers: { location } });

/**
 * Around Auth.js's handler: a plain GET of the mail's callback link (a mail scanner, say)
 * goes to the confirmation page and uses nothing up; a confirmation POST and a sign-out are
 * recorded in the access log; a refused link goes to a page that says why.
 */
const authEvents: Handle = async ({ event, resolve }) => {
	const { pathname, search, searchParams } = event.url;
	if (pathname === CALLBACK_PATH && event.request.method === 'GET') {
		return seeOther(`/signin/confirm${search}`);
	}
	if (pathname === CALLBACK_PATH && event.request.method === 'POST') {
		const email = (searchParams.get('email') ?? '').toLowerCase();
		const token = searchParams.get('token') ?? '';
		const state = await inspectSignInLink(email, token);
		const response = await resolve(event);
		const cookieName = sessionCookieName(event.url);
		const signedIn = response.headers
			.getSetCookie()
			.some((c) => c.startsWith(`${cookieName}=`) && !c.startsWith(`${cookieName}=;`));
		const link = { type: 'signin_link', id: linkLogId(signInTokenHash(token)) };
		if (signedIn) {
			await recordSignInEvent(event.locals.access, {
				action: 'signin.succeeded',
				outcome: 'success',
				email,
				target: link
			});
			return response;
		}
		await recordSignInEvent(event.locals.access, {
			action: state === 'valid' ? 'signin.refused' : 'signin.failed',
			outcome: state === 'valid' ? 'refused' : 'failed',
			email,
			target: state === 'valid' ? link : { type: 'signin_link_state', id: state }
		});
		return seeOther(`/signin/error?reason=${state === 'valid' ? 'refused' : state}`);
	}
	if (pathname === SIGNOUT_PATH && event.request.method === 'POST') {
		const token = event.cookies.get(sessionCookieName(event.url));
		const userId = token ? await sessionOwner(token) : null;
		const response = await resolve(event);
		if (userId) {
			await recordSignInEvent(event.locals.access, {
				action: 'signout',
				outcome: 'success',
				userId
			});
		}
		return response;
	}
	// Every other Auth.js route stays closed: links are asked for only through Seamwell's own
	// sign-in form (rate limits, equal timing, access log), and the session is read only by
	// loadPerson below (so a background request cannot extend it).
	if (pathname === AUTH_BASE || pathname.startsWith(`${AUTH_BASE}/`)) {
		return new Response('Not found', { status: 404, headers: { 'content-type': 'text/plain' } });
	}
	return resolve(event);
};

/**
 * Loads the signed-in person. Requests marked `x-seamwell-background: 1` (a page refreshing
 * itself) read the session without extending it: only what she does keeps her signed in.
 */
const loadPerson: Handle = async ({ event, resolve }) => {
	const cookieName = sessionCookieName(event.url);
	const token = event.cookies.get(cookieName);
	if (!token) return resolve(event);
	const background = event.request.headers.get('x-seamwell-background') === '1';
	const session = await resolveSession(token, {
		extend: !background,
		access: event.locals.access,
		organisationId: event.cookies.get(ORGANISATION_COOKIE) ?? null
	});
	const actor = session.state === 'active' ? session.actor : null;
	if (!actor || session.state !== 'active') {
		event.cookies.delete(cookieName, { path: '/' });
		return resolve(event);
	}
	event.locals.actor = actor;
	event.locals.access = {
		...event.locals.access,
		userId: actor.userId,
		role: accessRole(actor),
		organisationId: actor.activeOrganisationId
	};
	if (session.extended) {
		event.cookies.set(cookieName, token, {
			path: '/',
			httpOnly: true,
			sameSite: 'lax',
			secure: event.url.protocol === 'https:',
			expires: session.expires
		});
	}
	return resolve(event);
};

/**
 * Route groups guarded on the server: (app) needs a sign-in; a role's area is simply not
 * there for anyone else (the designed 404 page, and a row in the access log).
 */
const guardRoutes: Handle = async ({ event, resolve }) => {
	const decision = decideRoute(event.route.id, event.locals.actor);
	if (decision === 'signin') {
		const back = event.url.pathname + event.url.search;
		redirect(303, `/signin?callbackUrl=${encodeURIComponent(back)}`);
	}
	if (decision === 'hidden') {
		await recordRefusal(event.locals.access, {
			action: 'access.denied',
			target: { type: 'route', id: event.route.id ?? event.url.pathname }
		});
		const page = await event.fetch('/.not-here', { headers: { accept: 'text/html' } });
		return new Response(page.body, { status: 404, headers: page.headers });
	}
	return resolve(event);
};

/**
 * Every refusal is in the access log: a "not found" or "forbidden" answered to a signed-in
 * person on a real route (a malformed id, say) that no service recorded is logged here.
 */
const recordUnloggedRefusals: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	const access = event.locals.access;
	const refused = response.status === 403 || response.status === 404;
	if (refused && event.locals.actor && event.route.id && !hasRecordedRefusal(access)) {
		await recordRefusal(access, {
			action: 'access.denied',
			target: { type: 'path', id: event.url.pathname.slice(0, 300) }
		});
	}
	return response;
};

export const handle: Handle = sequence(
	securityHeaders,
	databaseOutage,
	requestShape,
	// Before anything reads a body: uploads may be 21 MB, every other request 1 MB.
	limitRequestBody,
	accessContext,
	authEvents,
	authHandle,
	loadPerson,
	recordUnloggedRefusals,
	guardRoutes
);

/**
 * Logs the error with an id and what failed (a query by name, never its parameters) and shows
 * the person a plain message with that id — never a stack.
 */
export const handleError: HandleServerError = ({ error, event, status, message }) => {
	if (status === 404) return { message: 'Not found' };
	if (isDatabaseUnavailable(error)) {
		lostDatabase.add(event.locals);
		return {
			message: 'Seamwell cannot reach its database right now. Please try again in a few seconds.'
		};
	}
	const errorId = randomUUID();
	console.error(
		`[error ${errorId}] ${event.request.method} ${event.route.id ?? event.url.pathname}: ${describeError(error)}`
	);
	return {
		message: status >= 500 ? 'Something went wrong on our side.' : message,
		errorId
	};
};

/**
 * Data a page loads through the JSON API on the server keeps the person's user agent, so the
 * access-log rows it writes say which browser asked (SvelteKit forwards only the cookies).
 */
export const handleFetch: HandleFetch = async ({ event, request, fetch }) => {
	const agent = event.request.headers.get('user-agent');
	if (!agent || new URL(request.url).origin !== event.url.origin) return fetch(request);
	const headers = new Headers(request.headers);
	headers.set('user-agent', agent);
	return fetch(new Request(request, { headers }));
};
