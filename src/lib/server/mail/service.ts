import { and, desc, eq, sql, type SQL } from 'drizzle-orm';
import { recordAccess, recordRefusal, type AccessContext } from '../audit';
import type { Caller } from '../context';
import { db } from '../db';
import { clients, invitations, memberships, outbox, users } from '../db/schema';
import { notFound } from '../http/problem';
import { assertAdmin } from '../people/policy';
import { SIGNIN_LINK_KIND } from './worker';

// Mail that gave up, for the admins whose people it was meant for: what, to whom and why —
// never its body — and a way to send it again.

export interface FailedMail {
	id: string;
	to: string;
	kind: string;
	attempts: number;
	lastError: string | null;
	createdAt: Date;
	/** Sign-in links are never sent again: the person asks for a new one. */
	resendable: boolean;
}

/** Addresses of an organisation's people: its members, its invitations and its clients. */
function addressesOf(organisationId: string): SQL {
	return sql`${outbox.to} in (
		select ${users.email} from ${users}
			join ${memberships} on ${memberships.userId} = ${users.id}
			where ${memberships.organisationId} = ${organisationId}
		union select ${invitations.email} from ${invitations}
			where ${invitations.organisationId} = ${organisationId}
		union select lower(${clients.email}) from ${clients}
			where ${clients.organisationId} = ${organisationId} and ${clients.email} is not null)`;
}

const asAdmin = (caller: Caller, organisationId: string): AccessContext => ({
	...caller.access,
	role: 'admin',
	organisationId
});

/**
 * Policy: admin of the active organisation (else 404); only mail to her organisation's people.
 * Audit: none — addresses and error texts of her own organisation's mail, no client data.
 */
export async function listFailedMailFor(caller: Caller, limit = 50): Promise<FailedMail[]> {
	const admin = assertAdmin(caller.actor);
	const rows = await db()
		.select({
			id: outbox.id,
			to: outbox.to,
			kind: outbox.kind,
			attempts: outbox.attempts,
			lastError: outbox.lastError,
			createdAt: outbox.createdAt
		})
		.from(outbox)
		.where(and(eq(outbox.state, 'failed'), addressesOf(admin.organisationId)))
		.orderBy(desc(outbox.createdAt))
		.limit(limit);
	return rows.map((r) => ({ ...r, resendable: r.kind !== SIGNIN_LINK_KIND }));
}

/**
 * Policy: admin of the active organisation, and a failed mail to her organisation's people
 * (else 404, recorded). Audit: mail.resent. The mail is queued again with a fresh 48-hour
 * retry window; the worker is woken by the queue's trigger.
 */
export async function resendFailedMail(caller: Caller, outboxId: string): Promise<void> {
	const admin = assertAdmin(caller.actor);
	const done = await db().transaction(async (tx) => {
		const updated = await tx
			.update(outbox)
			.set({
				state: 'pending',
				attempts: 0,
				nextAttemptAt: sql`now()`,
				retryFrom: sql`now()`,
				lastError: null
			})
			.where(
				and(
					eq(outbox.id, outboxId),
					eq(outbox.state, 'failed'),
					sql`${outbox.kind} <> ${SIGNIN_LINK_KIND}`,
					addressesOf(admin.organisationId)
				)
			)
			.returning({ id: outbox.id });
		if (updated.length === 0) return false;
		await tx.execute(sql`select pg_notify('seamwell_outbox', ${outboxId})`);
		await recordAccess(tx, asAdmin(caller, admin.organisationId), {
			action: 'mail.resent',
			outcome: 'success',
			target: { type: 'mail', id: outboxId }
		});
		return true;
	});
	if (!done) {
		await recordRefusal(caller.access, {
			action: 'mail.resent',
			target: { type: 'mail', id: outboxId }
		});
		throw notFound('No such failed mail, or it cannot be sent again.');
	}
}
