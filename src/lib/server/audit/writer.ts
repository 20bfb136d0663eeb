import { eq } from 'drizzle-orm';
import { db, type Executor } from '../db';
import { accessLog, subjectKeys } from '../db/schema';
import type { AuditAction, AuditOutcome } from './actions';

// The sole writer of the access log. Nothing else inserts into it, and no code path
// updates or deletes (the database refuses both anyway).

/** Who acted and from where: built once per request in hooks.server.ts. */
export interface AccessContext {
	userId: string | null;
	/** The role and organisation she acted in, when she acted in one. */
	role: string | null;
	organisationId: string | null;
	address: string | null;
	userAgent: string | null;
}

export interface AccessEvent {
	action: AuditAction;
	outcome: AuditOutcome;
	target?: { type: string; id: string };
	/** Whose data this touched: stored as her random subject key, never her id. */
	clientId?: string | null;
}

export const systemContext: AccessContext = {
	userId: null,
	role: 'system',
	organisationId: null,
	address: null,
	userAgent: null
};

/**
 * Records one access in the caller's transaction, so the row exists exactly when the work
 * it describes was committed.
 */
export async function recordAccess(
	executor: Executor,
	context: AccessContext,
	event: AccessEvent
): Promise<void> {
	const subjectKey = event.clientId ? await subjectKeyFor(executor, event.clientId) : null;
	await executor.insert(accessLog).values({
		actorUserId: context.userId,
		actorRole: context.role,
		actorOrganisationId: context.organisationId,
		action: event.action,
		targetType: event.target?.type ?? null,
		targetId: event.target?.id ?? null,
		subjectKey,
		outcome: event.outcome,
		clientAddress: context.address,
		userAgent: context.userAgent?.slice(0, 512) ?? null
	});
}

/**
 * Records a refused or failed access in a transaction of its own, outside any work in
 * progress: rolling that work back must not erase the record of the refusal.
 */
export async function recordRefusal(
	context: AccessContext,
	event: Omit<AccessEvent, 'outcome'> & { outcome?: Exclude<AuditOutcome, 'success'> }
): Promise<void> {
	await db().transaction((tx) =>
		recordAccess(tx, context, { ...event, outcome: event.outcome ?? 'refused' })
	);
}

/** The client's random subject key, created on first use. */
export async function subjectKeyFor(executor: Executor, clientId: string): Promise<string> {
	const inserted = await executor
		.insert(subjectKeys)
		.values({ clientId })
		.onConflictDoNothing({ target: subjectKeys.clientId })
		.returning({ key: subjectKeys.key });
	if (inserted[0]) return inserted[0].key;
	const [existing] = await executor
		.select({ key: subjectKeys.key })
		.from(subjectKeys)
		.where(eq(subjectKeys.clientId, clientId));
	if (!existing) throw new Error('subject key vanished between insert and select');
	return existing.key;
}
