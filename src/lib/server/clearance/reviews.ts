import { and, eq, inArray, isNotNull, or, sql } from 'drizzle-orm';
import type { ReviewItem } from '$lib/clearance/types';
import { recordAccess, recordSuccesses, systemContext } from '../audit';
import { config } from '../config';
import { refuse, type Caller } from '../context';
import { db, type Database, type Executor } from '../db';
import { clearances, clients, memberships, referrals, screenings, users } from '../db/schema';
import { ProblemError } from '../http/problem';
import { queueNotification } from '../mail/outbox';
import { mayListReviews } from './policy';
import { todayUtc } from './clearance';
import { instructorStudioIds, physioClinicIds } from '../scope';
import { startLoop, type Loop } from '../loop';

// Review dates: the dashboards list current clearances due within REVIEW_SOON_DAYS and those
// overdue; a background job queues one reminder REMINDER_DAYS before the review date to the
// physiotherapist who set it, the client's instructors and the client herself. The claim is an
// UPDATE … WHERE reminder_sent_at IS NULL in the transaction that queues the mails, so with
// several app processes each reminder goes out once.

export const REVIEW_SOON_DAYS = 14;
export const REMINDER_DAYS = 7;
const MS_PER_DAY = 86_400_000;

const addDays = (day: string, days: number) =>
	new Date(Date.parse(`${day}T00:00:00Z`) + days * MS_PER_DAY).toISOString().slice(0, 10);

/** The newest clearance of each client: nothing supersedes it. */
const isCurrent = sql`not exists (select 1 from ${clearances} as later where later.supersedes = ${clearances.id})`;

export type { ReviewItem };

/**
 * Policy: mayListReviews (instructors: their studios' clients; physiotherapists: current
 * clearances their clinics set). Audit: clearance.listed, one row per client shown.
 */
export async function listClearanceReviews(caller: Caller): Promise<ReviewItem[]> {
	const { actor } = caller;
	if (!mayListReviews(actor)) {
		return refuse(
			caller,
			'clearance.listed',
			new ProblemError('forbidden', {
				detail: 'Review dates are listed for instructors and physiotherapists.'
			})
		);
	}
	const today = todayUtc();
	const studios = instructorStudioIds(actor);
	const clinics = physioClinicIds(actor);
	const whose = or(
		studios.length ? inArray(clients.organisationId, studios) : undefined,
		clinics.length ? inArray(clearances.clinicId, clinics) : undefined
	);
	return db().transaction(async (tx) => {
		const rows = await tx
			.select({
				clearanceId: clearances.id,
				clientId: clients.id,
				clientName: clients.name,
				organisationId: clients.organisationId,
				referralId: clearances.referralId,
				reviewOn: clearances.reviewOn
			})
			.from(clearances)
			.innerJoin(clients, eq(clients.id, clearances.clientId))
			.where(
				and(whose, isCurrent, sql`${clearances.reviewOn} <= ${addDays(today, REVIEW_SOON_DAYS)}`)
			)
			.orderBy(clearances.reviewOn, clients.name)
			.limit(100);
		await recordSuccesses(
			tx,
			caller.access,
			'clearance.listed',
			rows.map((row) => ({
				target: { type: 'clearance', id: row.clearanceId },
				clientId: row.clientId
			}))
		);
		return rows.map((row) => ({
			clearanceId: row.clearanceId,
			clientId: row.clientId,
			clientName: row.clientName,
			reviewOn: row.reviewOn,
			overdue: row.reviewOn < today,
			href:
				studios.includes(row.organisationId) || !row.referralId
					? `/clients/${row.clientId}`
					: `/referrals/${row.referralId}`
		}));
	});
}

/**
 * Background work (no caller): claims the current clearances whose review is REMINDER_DAYS
 * away or nearer (and that were set earlier than that) and queues their reminders, in one
 * transaction per clearance. Audit: clearance.reminded, as the system. Returns how many
 * clearances it reminded of.
 */
export async function sendReviewReminders(database: Database, today = todayUtc()): Promise<number> {
	const horizon = addDays(today, REMINDER_DAYS);
	const due = await database
		.select({ id: clearances.id })
		.from(clearances)
		.where(
			and(
				sql`${clearances.reminderSentAt} is null`,
				isCurrent,
				sql`${clearances.reviewOn} between ${today} and ${horizon}`,
				sql`(${clearances.setAt} at time zone 'UTC')::date < ${clearances.reviewOn} - ${sql.raw(String(REMINDER_DAYS))}`
			)
		)
		.limit(100);
	let sent = 0;
	for (const { id } of due) {
		const claimed = await database.transaction(async (tx) => {
			// The claim: of several processes, exactly one sees the row still unclaimed.
			const [row] = await tx
				.update(clearances)
				.set({ reminderSentAt: new Date() })
				.where(and(eq(clearances.id, id), sql`${clearances.reminderSentAt} is null`))
				.returning();
			if (!row) return false;
			await queueReminders(tx, row);
			await recordAccess(tx, systemContext, {
				action: 'clearance.reminded',
				outcome: 'success',
				target: { type: 'clearance', id: row.id },
				clientId: row.clientId
			});
			return true;
		});
		if (claimed) sent += 1;
	}
	return sent;
}

async function queueReminders(tx: Executor, row: typeof clearances.$inferSelect): Promise<void> {
	const origin = config().ORIGIN;
	if (row.clientId === null) return; // the studio erased her record: nobody left to remind
	const [client] = await tx
		.select({ organisationId: clients.organisationId, userId: clients.userId })
		.from(clients)
		.where(eq(clients.id, row.clientId));
	if (!client) return;
	const mails = new Map<string, string>();
	// The physiotherapist who set it, if she still works there.
	if (row.setBy) {
		const [physio] = await tx
			.select({ email: users.email })
			.from(users)
			.innerJoin(memberships, eq(memberships.userId, users.id))
			.where(
				and(
					eq(users.id, row.setBy),
					eq(users.active, true),
					eq(memberships.organisationId, row.clinicId),
					eq(memberships.active, true)
				)
			);
		if (physio) {
			mails.set(
				physio.email,
				row.referralId ? `${origin}/referrals/${row.referralId}` : `${origin}/physio`
			);
		}
	}
	for (const email of await clientInstructors(tx, row.clientId, client.organisationId)) {
		mails.set(email, `${origin}/clients/${row.clientId}`);
	}
	if (client.userId) {
		const [self] = await tx
			.select({ email: users.email })
			.from(users)
			.where(and(eq(users.id, client.userId), eq(users.active, true)));
		if (self) mails.set(self.email, `${origin}/my-record`);
	}
	for (const [to, link] of mails) {
		await queueNotification(tx, { to, link, kind: 'clearance.review_due' });
	}
}

/**
 * Her instructors: those of her studio who recorded her screenings or referred her; when none
 * still teaches there, every instructor of the studio.
 */
async function clientInstructors(
	tx: Executor,
	clientId: string,
	studioId: string
): Promise<string[]> {
	const active = and(
		eq(memberships.organisationId, studioId),
		eq(memberships.role, 'instructor'),
		eq(memberships.active, true),
		eq(users.active, true)
	);
	const involved = tx
		.select({ id: screenings.recordedBy })
		.from(screenings)
		.where(and(eq(screenings.clientId, clientId), isNotNull(screenings.recordedBy)))
		.union(
			tx
				.select({ id: referrals.createdBy })
				.from(referrals)
				.where(and(eq(referrals.clientId, clientId), isNotNull(referrals.createdBy)))
		);
	const ids = (await involved).map((r) => r.id!).filter(Boolean);
	const rows = await tx
		.select({ email: users.email })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(ids.length ? and(active, inArray(users.id, ids)) : active);
	if (rows.length > 0 || ids.length === 0) return [...new Set(rows.map((r) => r.email))];
	const everyone = await tx
		.select({ email: users.email })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(active);
	return [...new Set(everyone.map((r) => r.email))];
}

/** Runs sendReviewReminders every `intervalMs` (default 10 min); logs, never throws. */
export function startReviewReminders(
	database: Database,
	options: {
		intervalMs?: number;
		log?: (line: string) => void;
		/** Other reminders sent on the same beat (the home-practice reminders). */
		also?: (database: Database) => Promise<unknown>;
	} = {}
): Loop {
	const intervalMs = options.intervalMs ?? 10 * 60 * 1000;
	return startLoop({
		name: '[clearance] review reminders',
		everyMs: intervalMs,
		firstInMs: Math.min(intervalMs, 30_000),
		recovered: 'database reachable again',
		log: options.log,
		run: async () => {
			await sendReviewReminders(database);
			if (options.also) await options.also(database);
		}
	});
}
