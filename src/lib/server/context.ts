import { redirect } from '@sveltejs/kit';
import { recordRefusal, type AccessContext, type AuditAction } from './audit';
import type { Actor } from './actor';
import { ProblemError } from './http/problem';

/**
 * What every service function receives first: who is asking (the actor, loaded once per
 * request by hooks.server.ts) and the request's access context for the access log.
 */
export interface Caller {
	actor: Actor;
	access: AccessContext;
}

/** For page loads and form actions: anonymous visitors go to sign-in and come back after. */
export function requirePageCaller(locals: App.Locals, url: URL): Caller {
	if (!locals.actor) {
		const back = url.pathname + url.search;
		redirect(303, `/signin?callbackUrl=${encodeURIComponent(back)}`);
	}
	return { actor: locals.actor, access: locals.access };
}

/** For JSON endpoints: anonymous callers get a 401 problem. */
export function requireApiCaller(locals: App.Locals): Caller {
	if (!locals.actor) {
		throw new ProblemError('unauthenticated', { detail: 'Sign in to use the Seamwell API.' });
	}
	return { actor: locals.actor, access: locals.access };
}

/**
 * Records a refused access (in its own transaction, so it survives the caller's rollback)
 * and throws the answer the caller gets — usually `notFound()`, never a hint that it exists.
 */
export async function refuse(
	caller: Caller,
	action: AuditAction,
	answer: ProblemError,
	target?: { type: string; id: string },
	clientId?: string | null
): Promise<never> {
	await recordRefusal(caller.access, { action, target, clientId: clientId ?? null });
	throw answer;
}
