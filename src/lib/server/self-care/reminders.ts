import { createHmac, timingSafeEqual } from 'node:crypto';
import { and, eq, lte } from 'drizzle-orm';
import { recordAccess, systemContext } from '../audit';
import { config } from '../config';
import { type Caller } from '../context';
import { db, type Database } from '../db';
import { clients, homePracticeReminders, users } from '../db/schema';
import { queueMail } from '../mail/outbox';
import { NOTIFICATION_WORDS } from '../mail/notifications';
import { REMINDER_INTERVAL_DAYS, addDays, ownClient, todayUtc } from './shared';

// ── Reminders ──────────────────────────────────────────────────────────────────────────

/** The unsubscribe token: an HMAC of her record's id, so the link works without signing in. */
export function unsubscribeToken(clientId: string, secret = config().AUTH_SECRET): string {
	return createHmac('sha256', secret).update(`practice-reminder:${clientId}`).digest('base64url');
}

function tokenMatches(clientId: string, token: string): boolean {
	const expected = Buffer.from(unsubscribeToken(clientId));
	const given = Buffer.from(token);
	return expected.length === given.length && timingSafeEqual(expected, given);
}

/** Policy: mayUseOwnSelfCare. Audit: home_practice.reminder_changed. */
export async function setPracticeReminder(
	caller: Caller,
	on: boolean
): Promise<{ on: boolean; nextDueOn: string | null }> {
	const client = await ownClient(caller, 'home_practice.reminder_changed');
	return db().transaction(async (tx) => {
		let nextDueOn: string | null = null;
		if (on) {
			nextDueOn = addDays(todayUtc(), REMINDER_INTERVAL_DAYS);
			await tx
				.insert(homePracticeReminders)
				.values({ clientId: client.id, nextDueOn })
				.onConflictDoNothing();
			const [row] = await tx
				.select()
				.from(homePracticeReminders)
				.where(eq(homePracticeReminders.clientId, client.id));
			nextDueOn = row?.nextDueOn ?? nextDueOn;
		} else {
			await tx.delete(homePracticeReminders).where(eq(homePracticeReminders.clientId, client.id));
		}
		await recordAccess(tx, caller.access, {
			action: 'home_practice.reminder_changed',
			outcome: 'success',
			target: { type: 'client', id: client.id },
			clientId: client.id
		});
		return { on, nextDueOn };
	});
}

/**
 * Policy: a valid signed token for this record (no sign-in). Audit:
 * home_practice.reminder_changed, as the system. True when the link was good.
 */
export async function unsubscribeFromReminders(clientId: string, token: string): Promise<boolean> {
	if (!/^[0-9a-f-]{36}$/i.test(clientId) || !tokenMatches(clientId, token)) return false;
	return db().transaction(async (tx) => {
		const [client] = await tx
			.select({ id: clients.id })
			.from(clients)
			.where(eq(clients.id, clientId));
		if (!client) return true;
		await tx.delete(homePracticeReminders).where(eq(homePracticeReminders.clientId, clientId));
		await recordAccess(tx, systemContext, {
			action: 'home_practice.reminder_changed',
			outcome: 'success',
			target: { type: 'client', id: clientId },
			clientId
		});
		return true;
	});
}

/**
 * Background work: queues the practice reminders due today, each claimed by moving its due
 * day on 4 weeks in the transaction that queues it (sent once across processes). The mail
 * holds no name and no health detail; its unsubscribe link needs no sign-in. Audit:
 * home_practice.reminded, as the system.
 */
export async function sendPracticeReminders(
	database: Database,
	today = todayUtc()
): Promise<number> {
	const due = await database
		.select({ clientId: homePracticeReminders.clientId })
		.from(homePracticeReminders)
		.where(lte(homePracticeReminders.nextDueOn, today))
		.limit(100);
	const origin = config().ORIGIN;
	let sent = 0;
	for (const { clientId } of due) {
		const done = await database.transaction(async (tx) => {
			const [claimed] = await tx
				.update(homePracticeReminders)
				.set({ nextDueOn: addDays(today, REMINDER_INTERVAL_DAYS) })
				.where(
					and(
						eq(homePracticeReminders.clientId, clientId),
						lte(homePracticeReminders.nextDueOn, today)
					)
				)
				.returning();
			if (!claimed) return false;
			const [person] = await tx
				.select({ email: users.email })
				.from(clients)
				.innerJoin(users, eq(users.id, clients.userId))
				.where(and(eq(clients.id, clientId), eq(users.active, true)));
			if (!person) return false;
			const words = NOTIFICATION_WORDS['practice.reminder'];
			const stop = `${origin}/reminders/unsubscribe?c=${clientId}&t=${unsubscribeToken(clientId)}`;
			await queueMail(tx, {
				to: person.email,
				kind: 'practice.reminder',
				subject: words.subject,
				text: [
					words.line,
					'',
					'Sign in to Seamwell to see your practice:',
					'',
					`${origin}/practice`,
					'',
					'To stop these reminders (no sign-in needed):',
					stop,
					'',
					'This message holds no details on purpose: they stay in Seamwell.'
				].join('\n')
			});
			await recordAccess(tx, systemContext, {
				action: 'home_practice.reminded',
				outcome: 'success',
				target: { type: 'client', id: clientId },
				clientId
			});
			return true;
		});
		if (done) sent += 1;
	}
	return sent;
}
