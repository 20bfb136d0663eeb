import { and, eq } from 'drizzle-orm';
import { type EffectiveLimits } from '../../domain';
import { limitsForRecords } from '../clearance/limits';
import { refuse, type Caller } from '../context';
import { clientRow } from '../clients/shared';
import { db, type Executor } from '../db';
import { clients, selfCheckSharing } from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { mayManageHomePractice, mayUseOwnSelfCare } from './policy';

// What the self-care modules (self-checks, home practice, follow-ups, reminders) share: days,
// her own client record behind a policy check, whether she shares her checks with a studio,
// and her effective limits.

type ClientRow = typeof clients.$inferSelect;

export const todayUtc = () => new Date().toISOString().slice(0, 10);
export const DAY_MS = 86_400_000;
/** A practice reminder every 4 weeks. */
export const REMINDER_INTERVAL_DAYS = 28;

export function addDays(day: string, days: number): string {
	return new Date(Date.parse(`${day}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}

export function fieldProblem(pointer: string, message: string): ProblemError {
	return new ProblemError('validation-failed', {
		detail: `1 field needs attention: ${pointer}`,
		errors: [{ pointer, message }]
	});
}

export async function ownClient(
	caller: Caller,
	action: Parameters<typeof refuse>[1]
): Promise<ClientRow> {
	if (!mayUseOwnSelfCare(caller.actor)) return refuse(caller, action, notFound());
	const [row] = await db().select().from(clients).where(eq(clients.id, caller.actor.clientId));
	if (!row) return refuse(caller, action, notFound());
	return row;
}

export async function isShared(tx: Executor, client: Pick<ClientRow, 'id' | 'organisationId'>) {
	const [row] = await tx
		.select({ shared: selfCheckSharing.shared })
		.from(selfCheckSharing)
		.where(
			and(
				eq(selfCheckSharing.clientId, client.id),
				eq(selfCheckSharing.organisationId, client.organisationId)
			)
		);
	return row?.shared ?? false;
}

/**
 * Her effective limits, read by the one loader of `effectiveLimits`: with her self-reported
 * symptoms in her own view always (`all`), studio-side only while she shares (`shared`).
 */
export async function limitsFor(
	tx: Executor,
	client: ClientRow,
	selfReports: 'all' | 'shared'
): Promise<EffectiveLimits> {
	// Her row was read before this (its limits version first, then what the limits rest on).
	const limits = await limitsForRecords(tx, [client], todayUtc(), { selfReports });
	return limits.get(client.id)!;
}

/** A client whose home practice the caller may manage (her studio's instructors); else a logged 404. */
export async function managedClient(
	caller: Caller,
	clientId: string,
	action: 'home_practice.read' | 'home_practice.set'
): Promise<ClientRow> {
	const client = await clientRow(clientId);
	if (!client || !mayManageHomePractice(caller.actor, client)) {
		return refuse(caller, action, notFound(), { type: 'client', id: clientId }, client?.id);
	}
	return client;
}
