import { and, desc, eq, isNotNull } from 'drizzle-orm';
import { erasureDueOn } from '../../domain/erasure';
import { recordAccess } from '../audit';
import { mayReadOwnRecord } from '../clients/policy';
import { config } from '../config';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import {
	clients,
	erasureRequests,
	memberships,
	organisations,
	referrals,
	users
} from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { queueNotification } from '../mail/outbox';
import { type ErasureRequestItem, selectItems, toItem } from './erasure-items';

// ── The client ───────────────────────────────────────────────────────────────────────────

/**
 * Policy: the client herself (mayReadOwnRecord). Audit: erasure.requested on her record.
 * 409 while a request of hers is open. Her studio's admins are told by mail.
 */
export async function requestErasure(
	caller: Caller,
	now = new Date()
): Promise<{ id: string; dueOn: string }> {
	const actor = caller.actor;
	if (!mayReadOwnRecord(actor)) {
		return refuse(caller, 'erasure.requested', notFound('You have no client record in Seamwell.'));
	}
	const clientId = actor.clientId;
	return db().transaction(async (tx) => {
		// Her record's lock makes two requests at once wait for each other.
		const [client] = await tx
			.select({ organisationId: clients.organisationId })
			.from(clients)
			.where(eq(clients.id, clientId))
			.for('update');
		if (!client) throw notFound('You have no client record in Seamwell.');
		const [open] = await tx
			.select({ requestedAt: erasureRequests.requestedAt, dueOn: erasureRequests.dueOn })
			.from(erasureRequests)
			.where(and(eq(erasureRequests.clientId, clientId), eq(erasureRequests.state, 'open')));
		if (open) {
			throw new ProblemError('conflict', {
				detail: `You already asked on ${open.requestedAt.toISOString().slice(0, 10)}; your studio must answer by ${open.dueOn}.`
			});
		}
		const dueOn = erasureDueOn(now);
		const [created] = await tx
			.insert(erasureRequests)
			.values({
				organisationId: client.organisationId,
				clientId,
				requestedBy: actor.userId,
				requestedAt: now,
				dueOn
			})
			.returning({ id: erasureRequests.id });
		await recordAccess(tx, caller.access, {
			action: 'erasure.requested',
			outcome: 'success',
			target: { type: 'erasure_request', id: created!.id },
			clientId
		});
		const admins = await tx
			.select({ email: users.email })
			.from(memberships)
			.innerJoin(users, eq(users.id, memberships.userId))
			.where(
				and(
					eq(memberships.organisationId, client.organisationId),
					eq(memberships.role, 'admin'),
					eq(memberships.active, true),
					eq(users.active, true)
				)
			);
		for (const email of new Set(admins.map((a) => a.email))) {
			await queueNotification(tx, {
				to: email,
				kind: 'erasure.requested',
				link: `${config().ORIGIN}/admin/data-requests/${created!.id}`
			});
		}
		return { id: created!.id, dueOn };
	});
}

/** Policy: the client herself. Her own requests, newest first (not logged: no one else's data). */
export async function listOwnErasureRequests(
	caller: Caller,
	now = new Date()
): Promise<ErasureRequestItem[]> {
	const actor = caller.actor;
	if (!mayReadOwnRecord(actor)) return [];
	const rows = await selectItems()
		.where(eq(erasureRequests.clientId, actor.clientId))
		.orderBy(desc(erasureRequests.requestedAt));
	return rows.map((row) => toItem(row, now));
}

/** What asking would mean for her, in words for the Privacy page. */
export interface ErasureOutlook {
	studioName: string;
	/** The day her studio would have to answer by, were she to ask today. */
	dueIfAskedToday: string;
	/** Clinics that received a referral of hers: they keep their own records. */
	clinicsKeeping: string[];
	requests: ErasureRequestItem[];
}

/** Policy: the client herself; null for anyone else. Not logged: it reads only her own. */
export async function erasureOutlook(
	caller: Caller,
	now = new Date()
): Promise<ErasureOutlook | null> {
	const actor = caller.actor;
	if (!mayReadOwnRecord(actor)) return null;
	const [studio] = await db()
		.select({ name: organisations.name })
		.from(clients)
		.innerJoin(organisations, eq(organisations.id, clients.organisationId))
		.where(eq(clients.id, actor.clientId));
	if (!studio) return null;
	const clinics = await db()
		.selectDistinct({ name: organisations.name })
		.from(referrals)
		.innerJoin(organisations, eq(organisations.id, referrals.clinicId))
		.where(and(eq(referrals.clientId, actor.clientId), isNotNull(referrals.sentAt)))
		.orderBy(organisations.name);
	return {
		studioName: studio.name,
		dueIfAskedToday: erasureDueOn(now),
		clinicsKeeping: clinics.map((c) => c.name),
		requests: await listOwnErasureRequests(caller, now)
	};
}
