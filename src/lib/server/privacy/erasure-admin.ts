import { and, asc, count, desc, eq, inArray, isNotNull, isNull, sql } from 'drizzle-orm';
import { recordAccess, recordAccesses } from '../audit';
import { config } from '../config';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import {
	clients,
	consents,
	documents,
	erasureRequests,
	organisations,
	planClients,
	referrals,
	screenings,
	selfChecks,
	homePracticeSessions,
	users
} from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { queueNotification } from '../mail/outbox';
import { eraseClient } from './erase';
import { studioAdminIds } from '../scope';
import {
	type ErasurePreview,
	type ErasureRequestItem,
	type ErasureState,
	selectItems,
	toItem
} from './erasure-items';

// ── The studio's admin ───────────────────────────────────────────────────────────────────

/**
 * Policy: admins of a studio, for their studios' requests. Audit: erasure.listed, one row per
 * open request shown (it names a client). Open requests first, soonest due first.
 */
export async function listErasureRequests(
	caller: Caller,
	query: { state?: ErasureState } = {},
	now = new Date()
): Promise<ErasureRequestItem[]> {
	const studios = studioAdminIds(caller.actor);
	if (studios.length === 0) {
		return refuse(
			caller,
			'erasure.listed',
			new ProblemError('forbidden', {
				detail: "Requests to erase data are answered by the studio's admins."
			})
		);
	}
	return db().transaction(async (tx) => {
		const rows = await selectItems(tx)
			.where(
				and(
					inArray(erasureRequests.organisationId, studios),
					query.state ? eq(erasureRequests.state, query.state) : undefined
				)
			)
			.orderBy(
				sql`${erasureRequests.state} = 'open' desc`,
				asc(erasureRequests.dueOn),
				desc(erasureRequests.requestedAt)
			)
			.limit(200);
		await recordAccesses(
			tx,
			caller.access,
			rows
				.filter((r) => r.request.clientId)
				.map((r) => ({
					action: 'erasure.listed' as const,
					outcome: 'success' as const,
					target: { type: 'erasure_request', id: r.request.id },
					clientId: r.request.clientId
				}))
		);
		return rows.map((row) => toItem(row, now));
	});
}

/** The request, if the caller is an admin of its studio; else a logged 404. */
export async function visibleErasureRequest(
	caller: Caller,
	id: string,
	action: 'erasure.read' | 'erasure.declined' | 'client.erased'
) {
	const [row] = await db().select().from(erasureRequests).where(eq(erasureRequests.id, id));
	if (!row || !studioAdminIds(caller.actor).includes(row.organisationId)) {
		return refuse(caller, action, notFound(), { type: 'erasure_request', id }, row?.clientId);
	}
	return row;
}

/**
 * Policy: an admin of the request's studio. Audit: erasure.read. The request and, while it is
 * open, what approving it would erase and what the clinics keep.
 */
export async function getErasureRequest(
	caller: Caller,
	id: string,
	now = new Date()
): Promise<{ request: ErasureRequestItem; preview: ErasurePreview | null }> {
	const row = await visibleErasureRequest(caller, id, 'erasure.read');
	return db().transaction(async (tx) => {
		const [item] = await selectItems(tx).where(eq(erasureRequests.id, id));
		await recordAccess(tx, caller.access, {
			action: 'erasure.read',
			outcome: 'success',
			target: { type: 'erasure_request', id },
			clientId: row.clientId
		});
		const request = toItem(item!, now);
		if (row.state !== 'open' || !row.clientId) return { request, preview: null };
		const c = row.clientId;
		const counted = async (
			table:
				| typeof screenings
				| typeof selfChecks
				| typeof homePracticeSessions
				| typeof consents
				| typeof planClients
		) => {
			const [r] = await tx.select({ n: count() }).from(table).where(eq(table.clientId, c));
			return r?.n ?? 0;
		};
		const [drafts] = await tx
			.select({ n: count() })
			.from(referrals)
			.where(and(eq(referrals.clientId, c), isNull(referrals.sentAt)));
		const kept = await tx
			.select({
				clinic: organisations.name,
				referrals: sql<number>`count(distinct ${referrals.id})::int`,
				documents: sql<number>`count(${documents.id})::int`
			})
			.from(referrals)
			.innerJoin(organisations, eq(organisations.id, referrals.clinicId))
			.leftJoin(documents, eq(documents.referralId, referrals.id))
			.where(and(eq(referrals.clientId, c), isNotNull(referrals.sentAt)))
			.groupBy(organisations.name)
			.orderBy(organisations.name);
		const [client] = await tx
			.select({ userId: clients.userId })
			.from(clients)
			.where(eq(clients.id, c));
		const preview: ErasurePreview = {
			erased: [
				{ what: 'Her client record', count: 1 },
				{ what: 'Screenings', count: await counted(screenings) },
				{ what: 'Her own checks', count: await counted(selfChecks) },
				{ what: 'Home practice sessions', count: await counted(homePracticeSessions) },
				{ what: 'Consents to share', count: await counted(consents) },
				{ what: 'Places in session plans', count: await counted(planClients) },
				{ what: 'Referral drafts never sent', count: drafts?.n ?? 0 }
			],
			keptByClinics: kept,
			signInErased: Boolean(client?.userId)
		};
		return { request, preview };
	});
}

/**
 * Policy: an admin of the request's studio (another studio's request: 404). Approve erases
 * (erase.ts) in this transaction; decline needs a reason, which the client reads. Either way
 * the client is told by mail. 409 once the request is answered.
 */
export async function decideErasure(
	caller: Caller,
	id: string,
	decision: { decision: 'approve' | 'decline'; reason?: string | null },
	now = new Date()
): Promise<ErasureRequestItem> {
	const action = decision.decision === 'approve' ? 'client.erased' : 'erasure.declined';
	await visibleErasureRequest(caller, id, action);
	return db().transaction(async (tx) => {
		const [row] = await tx
			.select()
			.from(erasureRequests)
			.where(eq(erasureRequests.id, id))
			.for('update');
		if (!row || row.state !== 'open' || !row.clientId) {
			throw new ProblemError('conflict', {
				detail: 'This request has already been answered.'
			});
		}
		const decided = { decidedBy: caller.actor.userId, decidedAt: now };
		if (decision.decision === 'decline') {
			const reason = decision.reason?.trim();
			if (!reason) {
				throw new ProblemError('validation-failed', {
					detail: 'Say why the request is declined: the client reads it.',
					errors: [{ pointer: '/reason', message: 'required when declining' }]
				});
			}
			await tx
				.update(erasureRequests)
				.set({ ...decided, state: 'declined', reason })
				.where(eq(erasureRequests.id, id));
			await recordAccess(tx, caller.access, {
				action: 'erasure.declined',
				outcome: 'success',
				target: { type: 'erasure_request', id },
				clientId: row.clientId
			});
			const [client] = await tx
				.select({ email: users.email })
				.from(clients)
				.innerJoin(users, eq(users.id, clients.userId))
				.where(eq(clients.id, row.clientId));
			if (client) {
				await queueNotification(tx, {
					to: client.email,
					kind: 'erasure.declined',
					link: `${config().ORIGIN}/privacy`
				});
			}
		} else {
			const { counts } = await eraseClient(
				tx,
				caller.access,
				{ clientId: row.clientId, studioId: row.organisationId, requestId: id },
				now
			);
			await tx
				.update(erasureRequests)
				.set({
					...decided,
					state: 'approved',
					clientId: null,
					reason: decision.reason?.trim() || null,
					erased: JSON.stringify(counts)
				})
				.where(eq(erasureRequests.id, id));
		}
		const [item] = await selectItems(tx).where(eq(erasureRequests.id, id));
		return toItem(item!, now);
	});
}

/** For the admin dashboard: open requests of her studios, and how many are overdue. */
export async function erasureRequestCounts(
	caller: Caller,
	now = new Date()
): Promise<{ open: number; overdue: number }> {
	const studios = studioAdminIds(caller.actor);
	if (studios.length === 0) return { open: 0, overdue: 0 };
	const today = now.toISOString().slice(0, 10);
	const [row] = await db()
		.select({
			open: count(),
			overdue: sql<number>`count(*) filter (where ${erasureRequests.dueOn} < ${today})::int`
		})
		.from(erasureRequests)
		.where(
			and(inArray(erasureRequests.organisationId, studios), eq(erasureRequests.state, 'open'))
		);
	return { open: row?.open ?? 0, overdue: row?.overdue ?? 0 };
}
