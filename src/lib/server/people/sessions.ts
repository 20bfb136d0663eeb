import { and, desc, eq, gt, inArray, sql } from 'drizzle-orm';
import { createHash } from 'node:crypto';
import type { Actor, Membership } from '../actor';
import { recordAccess, type AccessContext } from '../audit';
import type { AuditAction, AuditOutcome } from '../audit';
import { config } from '../config';
import { db, type Executor } from '../db';
import { accessLog, outbox, sessions, users, verificationTokens } from '../db/schema';

// Sessions and sign-in bookkeeping, called by hooks.server.ts and src/lib/server/auth.ts
// (not by routes): reading a session without extending it, the idle and absolute limits,
// the actor, who may receive a sign-in link, and the access-log rows of signing in and out.

/** Idle timeout (ASVS 7.3.1): a session unused this long ends. */
export const SESSION_IDLE_SECONDS = 30 * 60;
/** Absolute lifetime from sign-in (ASVS 7.3.2), whatever the activity. */
export const SESSION_ABSOLUTE_SECONDS = 12 * 60 * 60;
/** Activity moves the idle deadline at most this often (one write a minute, not per request). */
export const SESSION_TOUCH_SECONDS = 60;
/** A sign-in link lives this long and works once (ASVS 6.5.1, 6.5.5). */
export const SIGNIN_LINK_SECONDS = 10 * 60;

/** The cookie holding the organisation she chose to act in; checked against her memberships on every request. */
export const ORGANISATION_COOKIE = 'seamwell-org';

export type SessionEnd = 'idle' | 'absolute' | 'inactive';

export type SessionState =
	| { state: 'none' }
	| { state: 'ended'; userId: string; reason: SessionEnd }
	| { state: 'active'; userId: string; expires: Date; extended: boolean; actor: Actor };

/** Why a session row can no longer be used, or null while it may. */
export function sessionEnd(
	row: { expires: Date; createdAt: Date; active: boolean },
	now = new Date()
): SessionEnd | null {
	if (!row.active) return 'inactive';
	if (now.getTime() - row.createdAt.getTime() >= SESSION_ABSOLUTE_SECONDS * 1000) return 'absolute';
	if (row.expires.getTime() <= now.getTime()) return 'idle';
	return null;
}

/**
 * Reads the session behind a cookie, and the person it belongs to, in one statement: this
 * runs on every signed-in request. Ordinary requests slide the idle deadline; background
 * requests (`extend: false`) only read, so a page refreshing itself keeps no one signed in.
 * An ended session is deleted and its end recorded in the access log.
 */
export async function resolveSession(
	token: string,
	options: { extend: boolean; access: AccessContext; organisationId?: string | null }
): Promise<SessionState> {
	const result = await db().execute<
		PersonRow & { expires: Date | string; created_at: Date | string }
	>(sql`
		select s.expires, s.created_at, ${personColumns}
		from sessions s join users u on u.id = s.user_id
		where s.session_token = ${token}`);
	const found = result.rows[0];
	if (!found) return { state: 'none' };
	const row = {
		userId: found.id,
		expires: new Date(found.expires),
		createdAt: new Date(found.created_at),
		active: found.active
	};
	const now = new Date();
	const ended = sessionEnd(row, now);
	if (ended) {
		await db().transaction(async (tx) => {
			await tx.delete(sessions).where(eq(sessions.sessionToken, token));
			await recordAccess(
				tx,
				{ ...options.access, userId: row.userId },
				{
					action: 'session.expired',
					outcome: 'refused',
					target: { type: 'session_end', id: ended }
				}
			);
		});
		return { state: 'ended', userId: row.userId, reason: ended };
	}
	const actor = actorFrom(found, options.organisationId ?? null);
	const idleDeadline = new Date(now.getTime() + SESSION_IDLE_SECONDS * 1000);
	const due = idleDeadline.getTime() - row.expires.getTime() >= SESSION_TOUCH_SECONDS * 1000;
	if (!options.extend || !due) {
		return { state: 'active', userId: row.userId, expires: row.expires, extended: false, actor };
	}
	await db()
		.update(sessions)
		.set({ expires: idleDeadline })
		.where(eq(sessions.sessionToken, token));
	return { state: 'active', userId: row.userId, expires: idleDeadline, extended: true, actor };
}

type PersonRow = {
	id: string;
	email: string;
	name: string | null;
	active: boolean;
	client_id: string | null;
	memberships: Membership[];
};

/** The person, her active memberships and her client record, from `users u`. */
const personColumns = sql`u.id, u.email, u.name, u.active,
	(select c.id from clients c where c.user_id = u.id) as client_id,
	coalesce((
		select json_agg(json_build_object(
			'organisationId', m.organisation_id, 'organisationName', o.name,
			'kind', o.kind, 'role', m.role) order by o.name, m.role)
		from memberships m join organisations o on o.id = m.organisation_id
		where m.user_id = u.id and m.active
	), '[]'::json) as memberships`;

function actorFrom(user: PersonRow, chosenOrganisationId: string | null): Actor {
	const held: Membership[] = user.memberships;
	const chosen = held.find((m) => m.organisationId === chosenOrganisationId);
	return {
		userId: user.id,
		email: user.email,
		name: user.name,
		memberships: held,
		// She is a client when a studio's client record names her (clients.user_id).
		clientId: user.client_id,
		activeOrganisationId: chosen?.organisationId ?? held[0]?.organisationId ?? null
	};
}

/** The signed-in person as routes and services see her, acting in the chosen organisation. */
export async function loadActor(
	userId: string,
	chosenOrganisationId: string | null
): Promise<Actor | null> {
	const result = await db().execute<PersonRow>(
		sql`select ${personColumns} from users u where u.id = ${userId}`
	);
	const user = result.rows[0];
	if (!user || !user.active) return null;
	return actorFrom(user, chosenOrganisationId);
}

/** The role string for the access log: every role she holds where she acts (e.g. admin+instructor). */
export function accessRole(actor: Actor): string | null {
	const roles = actor.memberships
		.filter((m) => m.organisationId === actor.activeOrganisationId)
		.map((m) => m.role);
	if (roles.length > 0) return roles.join('+');
	return actor.clientId || actor.memberships.length === 0 ? 'client' : null;
}

/** Who an address belongs to and whether a sign-in link may be sent there. */
export async function signInEligibility(
	email: string
): Promise<{ userId: string | null; eligible: boolean }> {
	const [user] = await db()
		.select({ id: users.id, active: users.active })
		.from(users)
		.where(eq(users.email, email.toLowerCase()));
	return { userId: user?.id ?? null, eligible: Boolean(user?.active) };
}

/** The hash Auth.js stores for a sign-in token: SHA-256 of token and secret, hex. */
export function signInTokenHash(token: string): string {
	return createHash('sha256').update(`${token}${config().AUTH_SECRET}`).digest('hex');
}

/**
 * Stores a new sign-in token and ends the person's earlier unused links (one transaction):
 * her other tokens are deleted, so only the newest link works. Auth.js calls it through the
 * adapter in auth.ts, with the token already hashed.
 */
export async function replaceSignInToken(token: {
	identifier: string;
	token: string;
	expires: Date;
}): Promise<void> {
	const address = token.identifier.toLowerCase();
	await db().transaction(async (tx) => {
		await tx.delete(verificationTokens).where(eq(verificationTokens.identifier, address));
		await tx.insert(verificationTokens).values({ ...token, identifier: address });
	});
}

/**
 * Link mails still waiting in the outbox for this address are not sent once a newer link is
 * queued (`superseded`): their tokens no longer work.
 */
export async function supersedeUnsentSignInMail(tx: Executor, email: string): Promise<void> {
	await tx
		.update(outbox)
		.set({ state: 'superseded', lastError: 'replaced by a newer sign-in link before it was sent' })
		.where(
			and(
				eq(outbox.to, email.toLowerCase()),
				eq(outbox.kind, 'signin.link'),
				eq(outbox.state, 'pending')
			)
		);
}

/** The part of the token hash the access log keeps, so a reused link can be recognised. */
export const linkLogId = (tokenHash: string) => tokenHash.slice(0, 32);

export type LinkState = 'valid' | 'expired' | 'used' | 'invalid';

/** Tells a usable sign-in link from an expired, used or altered one — without using it up. */
export async function inspectSignInLink(email: string, token: string): Promise<LinkState> {
	if (!email || !token) return 'invalid';
	const hash = signInTokenHash(token);
	const [row] = await db()
		.select({ expires: verificationTokens.expires })
		.from(verificationTokens)
		.where(
			and(
				eq(verificationTokens.identifier, email.toLowerCase()),
				eq(verificationTokens.token, hash)
			)
		);
	if (row) return row.expires.getTime() > Date.now() ? 'valid' : 'expired';
	const [used] = await db()
		.select({ id: accessLog.id })
		.from(accessLog)
		.where(
			and(
				gt(accessLog.at, sql`now() - interval '1 day'`),
				eq(accessLog.targetType, 'signin_link'),
				eq(accessLog.targetId, linkLogId(hash)),
				inArray(accessLog.action, ['signin.succeeded', 'signin.refused'])
			)
		)
		.orderBy(desc(accessLog.id))
		.limit(1);
	return used ? 'used' : 'invalid';
}

/** One access-log row for a sign-in event; the person is found by address when known. */
export async function recordSignInEvent(
	access: AccessContext,
	event: {
		action: AuditAction;
		outcome: AuditOutcome;
		email?: string | null;
		userId?: string | null;
		target?: { type: string; id: string };
	}
): Promise<void> {
	let userId = event.userId ?? null;
	if (!userId && event.email) userId = (await signInEligibility(event.email)).userId;
	await db().transaction((tx) =>
		recordAccess(
			tx,
			{ ...access, userId },
			{ action: event.action, outcome: event.outcome, target: event.target }
		)
	);
}

/** The person behind a session cookie, without touching the session (for sign-out logging). */
export async function sessionOwner(token: string): Promise<string | null> {
	const [row] = await db()
		.select({ userId: sessions.userId })
		.from(sessions)
		.where(eq(sessions.sessionToken, token));
	return row?.userId ?? null;
}
