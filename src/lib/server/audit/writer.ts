import { inArray, sql } from 'drizzle-orm';
import { ownDb, type Executor } from '../db';
import { sharedTransaction } from '../db/scope';
import { accessLog, subjectKeys } from '../db/schema';
import { AUDIT_ACTIONS, AUDIT_OUTCOMES, type AuditAction, type AuditOutcome } from './actions';

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

const knownActions = new Set<string>(AUDIT_ACTIONS);
const knownOutcomes = new Set<string>(AUDIT_OUTCOMES);

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
	await recordAccesses(executor, context, [event]);
}

/**
 * Records several accesses in the caller's transaction with a fixed number of statements,
 * whatever their count: a list page of 25 clients writes its 25 rows in one insert.
 */
export async function recordAccesses(
	executor: Executor,
	context: AccessContext,
	events: readonly AccessEvent[]
): Promise<void> {
	if (events.length === 0) return;
	for (const event of events) {
		// Types already say so; this holds against casts and untyped callers too.
		if (!knownActions.has(event.action)) {
			throw new Error(`unknown access-log action ${event.action}`);
		}
		if (!knownOutcomes.has(event.outcome)) {
			throw new Error(`unknown access-log outcome ${event.outcome}`);
		}
	}
	const shared = sharedTransaction();
	if (shared && executor === shared.executor) {
		// A page's shared transaction writes every service's rows in one insert before it
		// commits (see `readAsOne`): same rows, same transaction, one statement.
		let pending = pendingRows.get(shared);
		if (!pending) {
			const rows = new Map<AccessContext, AccessEvent[]>();
			pending = rows;
			pendingRows.set(shared, rows);
			shared.beforeCommit.push(async () => {
				for (const [who, rowsOf] of rows) await insertAccesses(shared.tx, who, rowsOf);
			});
		}
		pending.set(context, [...(pending.get(context) ?? []), ...events]);
		return;
	}
	await insertAccesses(executor, context, events);
}

/** Rows recorded in a page's shared transaction, not yet written: one insert per context. */
const pendingRows = new WeakMap<object, Map<AccessContext, AccessEvent[]>>();

async function insertAccesses(
	executor: Executor,
	context: AccessContext,
	events: readonly AccessEvent[]
): Promise<void> {
	const keys = await subjectKeysFor(
		executor,
		events.flatMap((e) => (e.clientId ? [e.clientId] : []))
	);
	// One array parameter per column (unnest), not one parameter per cell: the statement is
	// the same size for 1 row or 25, and cheap to build and send.
	const column = <T>(pick: (event: AccessEvent) => T) => sql.param(events.map(pick));
	await executor.execute(sql`
		insert into ${accessLog} (actor_user_id, actor_role, actor_organisation_id, action,
			target_type, target_id, subject_key, outcome, client_address, user_agent)
		select ${context.userId}::uuid, ${context.role}::text, ${context.organisationId}::uuid,
			e.action, e.target_type, e.target_id, e.subject_key, e.outcome,
			${context.address}::text, ${context.userAgent?.slice(0, 512) ?? null}::text
		from unnest(
			${column((e) => e.action)}::text[],
			${column((e) => e.target?.type ?? null)}::text[],
			${column((e) => e.target?.id ?? null)}::text[],
			${column((e) => (e.clientId ? (keys.get(e.clientId) ?? null) : null))}::uuid[],
			${column((e) => e.outcome)}::text[]
		) with ordinality as e(action, target_type, target_id, subject_key, outcome, n)
		order by e.n`);
	if (events.some((e) => e.outcome !== 'success')) refusalsRecorded.add(context);
}

/** One success row per record read or listed, in one statement (see `recordAccesses`). */
export function recordSuccesses(
	executor: Executor,
	context: AccessContext,
	action: AuditAction,
	accessed: ReadonlyArray<Omit<AccessEvent, 'action' | 'outcome'>>
): Promise<void> {
	return recordAccesses(
		executor,
		context,
		accessed.map((event) => ({ ...event, action, outcome: 'success' as const }))
	);
}

/** Request contexts that already have a refusal on record (see hasRecordedRefusal). */
const refusalsRecorded = new WeakSet<AccessContext>();

/**
 * True when this request already logged a refusal: the hooks log any other "not found"
 * answer to a signed-in person (a malformed id, say) so that no refusal goes unrecorded.
 */
export function hasRecordedRefusal(context: AccessContext): boolean {
	return refusalsRecorded.has(context);
}

/**
 * Records a refused or failed access in a transaction of its own, outside any work in
 * progress: rolling that work back must not erase the record of the refusal.
 */
export async function recordRefusal(
	context: AccessContext,
	event: Omit<AccessEvent, 'outcome'> & { outcome?: Exclude<AuditOutcome, 'success'> }
): Promise<void> {
	const write = () =>
		ownDb().transaction((tx) =>
			recordAccess(tx, context, { ...event, outcome: event.outcome ?? 'refused' })
		);
	// Inside a page's shared transaction: written as soon as it ends (readAsOne waits for it).
	const shared = sharedTransaction();
	if (shared) shared.afterEnd.push(write);
	else await write();
}

/** The client's random subject key, created on first use. */
export async function subjectKeyFor(executor: Executor, clientId: string): Promise<string> {
	const key = (await subjectKeysFor(executor, [clientId])).get(clientId);
	if (!key) throw new Error('subject key vanished between insert and select');
	return key;
}

/**
 * Subject keys known to be committed, per client: a key never changes, so a request that logs
 * an access to a client this process has seen before needs no lookup. Only keys created before
 * the current transaction began are kept (a key made in a transaction that then rolls back
 * must not outlive it). Erasing a client deletes her key; `forgetSubjectKey` drops it here,
 * and a copy another process still holds can only label rows about a client who is gone, with
 * a key nothing maps back to her.
 */
const knownKeys = new Map<string, string>();
const KNOWN_KEYS_MAX = 50_000;

export function forgetSubjectKey(clientId: string): void {
	knownKeys.delete(clientId);
}

function remember(clientId: string, key: string): void {
	if (knownKeys.size >= KNOWN_KEYS_MAX) {
		const oldest = knownKeys.keys().next().value;
		if (oldest !== undefined) knownKeys.delete(oldest);
	}
	knownKeys.set(clientId, key);
}

/**
 * The subject keys of several clients, creating the missing ones: none or one select when
 * every key exists (the usual case), else an insert of the missing ones and a second select.
 */
async function subjectKeysFor(
	executor: Executor,
	clientIds: readonly string[]
): Promise<Map<string, string>> {
	const found = new Map<string, string>();
	const wanted: string[] = [];
	for (const id of new Set(clientIds)) {
		const key = knownKeys.get(id);
		if (key) found.set(id, key);
		else wanted.push(id);
	}
	if (wanted.length === 0) return found;
	const read = async (ids: string[]) => {
		const rows = await executor
			.select({
				clientId: subjectKeys.clientId,
				key: subjectKeys.key,
				committed: sql<boolean>`${subjectKeys.createdAt} < now()`
			})
			.from(subjectKeys)
			.where(inArray(subjectKeys.clientId, ids));
		for (const row of rows) {
			found.set(row.clientId, row.key);
			if (row.committed) remember(row.clientId, row.key);
		}
	};
	await read(wanted);
	const missing = wanted.filter((id) => !found.has(id));
	if (missing.length === 0) return found;
	await executor
		.insert(subjectKeys)
		.values(missing.map((clientId) => ({ clientId })))
		.onConflictDoNothing({ target: subjectKeys.clientId });
	await read(missing);
	return found;
}
