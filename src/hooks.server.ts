import { redirect, type Handle, type HandleServerError, type ServerInit } from '@sveltejs/kit';
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
import { decideRoute } from '$lib/server/people/policy';
import {
	ORGANISATION_COOKIE,
	accessRole,
	inspectSignInLink,
	linkLogId,
	loadActor,
	recordSignInEvent,
	resolveSession,
	sessionOwner,
	signInTokenHash
} from '$lib/server/people/sessions';
import { hasRecordedRefusal, recordRefusal } from '$lib/server/audit';
import { limitRequestBody } from '$lib/server/documents/limits';
import { startBackgroundWorkers } from '$lib/server/workers';

let stopWorkers: (() => Promise<void>) | undefined;

// Fail at start-up, naming the variable, rather than on the first request; then start the
// mail outbox worker and the log sealer once per process.
export const init: ServerInit = async () => {
	config();
	stopWorkers ??= startBackgroundWorkers();
};

/** Headers every response carries; the Content-Security-Policy comes from svelte.config.js. */
/**
 * Headers every response carries. One list, so a response whose headers must be copied
 * (below) gets exactly the same ones. Non-page responses (JSON, files) get a CSP that forbids
 * everything active; pages keep SvelteKit's own.
 */
const SECURITY_HEADERS: ReadonlyArray<readonly [string, string]> = [
	['X-Content-Type-Options', 'nosniff'],
	['Referrer-Policy', 'strict-origin-when-cross-origin'],
	['X-Frame-Options', 'DENY'],
	['Cross-Origin-Opener-Policy', 'same-origin'],
	['Permissions-Policy', 'camera=(), microphone=(), geolocation=(), payment=()'],
	['Content-Security-Policy', "default-src 'none'; frame-ancestors 'none'"]
];

function addSecurityHeaders(headers: Headers) {
	for (const [name, value] of SECURITY_HEADERS) {
		if (!headers.has(name)) headers.set(name, value);
	}
}

const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	try {
		addSecurityHeaders(response.headers);
	} catch {
		// Some responses (redirects made by libraries) have immutable headers: copy them.
		const copy = new Response(response.body, response);
		addSecurityHeaders(copy.headers);
		return copy;
	}
	return response;
};

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
		access: event.locals.access
	});
	const actor =
		session.state === 'active'
			? await loadActor(session.userId, event.cookies.get(ORGANISATION_COOKIE) ?? null)
			: null;
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
	// Before anything reads a body: uploads may be 21 MB, every other request 1 MB.
	limitRequestBody,
	accessContext,
	authEvents,
	authHandle,
	loadPerson,
	recordUnloggedRefusals,
	guardRoutes
);

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
