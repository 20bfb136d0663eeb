import { clearanceStatus } from '$lib/clearance/words';
import { loadEffectiveLimits } from '../clearance/limits';
import { and, asc, desc, eq, ilike, isNull, lt, or, sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import {
	chartSeries,
	DEFAULT_MM_PER_FINGER,
	screeningTrend,
	weeksOfGestation,
	weeksPostpartum,
	type SiteTrend,
	type SiteTrendPoint
} from '$lib/domain';
import {
	clientFieldsSchema,
	SCREENING_DUE_WEEKS,
	type ClientCreateInput,
	type ClientListFilter,
	type ClientPatchInput,
	type ScreeningInputData
} from '$lib/clients/schemas';
import { recordAccess, recordAccesses, recordRefusal, type AuditAction } from '../audit';
import { config } from '../config';
import type { Caller } from '../context';
import { db, type Executor } from '../db';
import { clients, screenings, users } from '../db/schema';
import { notFound, ProblemError, validationProblem } from '../http/problem';
import { cursorKey, decodeCursor, toPage, type Page } from '../http/schemas';
import { queueMail } from '../mail/outbox';
import { assertSelf } from '../people/policy';
import {
	instructorStudioIds,
	mayListClients,
	mayReadClient,
	mayReadOwnRecord,
	mayWriteClient,
	studioForNewClient
} from './policy';
import {
	assertNotBeforeConsent,
	buildScreeningRecord,
	ScreeningDateError
} from './screening-record';
import type {
	ClientDetail,
	ClientSummary,
	FingerFactor,
	RecordedScreening,
	ScreeningHistory,
	ScreeningView,
	TrendBySite,
	TrendView
} from '$lib/clients/types';

// Client records and their screenings. Every exported function begins by asserting a rule
// from ./policy.ts, does its work and its access-log row in one transaction, and answers 404
// (logged) for a record the caller may not know of.

type ClientRow = typeof clients.$inferSelect;
type ScreeningRow = typeof screenings.$inferSelect;

export type {
	ClientDetail,
	ClientSummary,
	FingerFactor,
	RecordedScreening,
	ScreeningHistory,
	ScreeningView,
	TrendBySite,
	TrendView
};

const todayIso = () => new Date().toISOString();

function weeksNow(row: ClientRow): number | null {
	const now = new Date();
	try {
		if (row.stage === 'postpartum' && row.birthDate) return weeksPostpartum(row.birthDate, now);
		if (row.stage === 'pregnant' && row.dueDate) return weeksOfGestation(row.dueDate, now);
	} catch {
		return null;
	}
	return null;
}

function toSummary(row: ClientRow): ClientSummary {
	return {
		id: row.id,
		name: row.name,
		email: row.email,
		stage: row.stage,
		lastScreenedAt: row.lastScreenedAt?.toISOString() ?? null,
		lastOutcome: row.lastOutcome
	};
}

function toDetail(row: ClientRow): ClientDetail {
	return {
		...toSummary(row),
		organisationId: row.organisationId,
		birthYear: row.birthYear,
		dueDate: row.dueDate,
		birthDate: row.birthDate,
		delivery: row.delivery,
		births: row.births,
		multiples: row.multiples,
		postnatalCheckOn: row.postnatalCheckOn,
		postnatalCleared: row.postnatalCleared,
		notes: row.notes,
		intakeConsent:
			row.intakeConsentAt && row.intakeConsentMethod
				? {
						at: row.intakeConsentAt.toISOString(),
						method: row.intakeConsentMethod,
						takenBy: row.intakeConsentTakenBy
					}
				: null,
		signInLinked: row.userId !== null,
		weeksNow: weeksNow(row)
	};
}

function toScreeningView(row: ScreeningRow): ScreeningView {
	return {
		id: row.id,
		takenAt: row.takenAt.toISOString(),
		sites: row.sites,
		redFlags: row.redFlags,
		notes: row.notes,
		stage: row.stage,
		weeksPostpartum: row.weeksPostpartum,
		weeksOfGestation: row.weeksOfGestation,
		outcome: row.outcome,
		reasons: row.reasons,
		warnings: row.warnings,
		rulesVersion: row.rulesVersion
	};
}

function trendView(trend: SiteTrend<SiteTrendPoint>): TrendView {
	return {
		direction: trend.direction,
		changeSinceFirst: trend.changeSinceFirst,
		changeSincePrevious: trend.changeSincePrevious,
		changePerWeek:
			trend.changePerWeek === null ? null : Math.round(trend.changePerWeek * 100) / 100,
		jump:
			trend.jump === null
				? null
				: {
						direction: trend.jump.direction,
						by: trend.jump.by,
						since: new Date(trend.jump.since.takenAt).toISOString()
					}
	};
}

function trendBySite(rows: ReadonlyArray<Pick<ScreeningRow, 'takenAt' | 'sites'>>): TrendBySite {
	const trend = screeningTrend(rows);
	return {
		above_navel: trendView(trend.above_navel),
		at_navel: trendView(trend.at_navel),
		below_navel: trendView(trend.below_navel)
	};
}

/**
 * Loads a client record the caller may see (or change). Anything else — no such record, or
 * one of another studio — is logged as refused and answers 404, the same either way.
 */
async function clientFor(
	caller: Caller,
	id: string,
	action: AuditAction,
	rule: typeof mayReadClient
): Promise<ClientRow> {
	const [row] = await db().select().from(clients).where(eq(clients.id, id));
	if (!row || !rule(caller.actor, row)) {
		await recordRefusal(caller.access, {
			action,
			target: { type: 'client', id },
			// A subject key only for a record that exists (the key map references clients).
			clientId: row?.id ?? null
		});
		throw notFound();
	}
	return row;
}

async function refuseList(caller: Caller, action: AuditAction): Promise<never> {
	await recordRefusal(caller.access, { action });
	throw new ProblemError('forbidden', {
		detail: 'Client records are kept by the instructors of a studio.'
	});
}

/** The list's cursor: the last row's sort key (a name, or when she was last screened) and id. */
const listCursors = {
	name: z.strictObject({ k: cursorKey.text, id: cursorKey.id }),
	lastScreenedAt: z.strictObject({ k: cursorKey.moment.nullable(), id: cursorKey.id })
};

function escapeLike(term: string): string {
	return term.replace(/[\\%_]/g, (c) => `\\${c}`);
}

/** The `needs` filters, shared by the list and the dashboard's counts so both agree. */
function needsCondition(needs: NonNullable<ClientListFilter['needs']>): SQL {
	if (needs === 'referral') return eq(clients.lastOutcome, 'refer');
	const due = new Date(Date.now() - SCREENING_DUE_WEEKS * 7 * 86_400_000);
	return or(isNull(clients.lastScreenedAt), lt(clients.lastScreenedAt, due))!;
}

/** Her studios as an SQL condition on the client's organisation. */
function inStudios(studios: readonly string[]): SQL {
	return sql`${clients.organisationId} in (${sql.join(
		studios.map((s) => sql`${s}::uuid`),
		sql`, `
	)})`;
}

export interface ClientCounts {
	/** Her studios' client records. */
	total: number;
	/** Whose latest screening says refer (the list's `needs=referral`). */
	needsReferral: number;
	/** Never screened, or not in SCREENING_DUE_WEEKS weeks (the list's `needs=screening`). */
	needsScreening: number;
}

/**
 * Policy: mayListClients (her studios only). Audit: none — numbers of records name no client
 * and show none of her data; the list they link to logs client.listed for each client shown.
 */
export async function countClients(caller: Caller): Promise<ClientCounts> {
	if (!mayListClients(caller.actor)) return refuseList(caller, 'client.listed');
	const mine = inStudios(instructorStudioIds(caller.actor));
	const [row] = await db()
		.select({
			total: sql<number>`count(*)::int`,
			needsReferral: sql<number>`(count(*) filter (where ${needsCondition('referral')}))::int`,
			needsScreening: sql<number>`(count(*) filter (where ${needsCondition('screening')}))::int`
		})
		.from(clients)
		.where(mine);
	return {
		total: row?.total ?? 0,
		needsReferral: row?.needsReferral ?? 0,
		needsScreening: row?.needsScreening ?? 0
	};
}

/** Policy: mayListClients (her studios only). Audit: client.listed, one row per client shown. */
export async function listClients(
	caller: Caller,
	query: ClientListFilter & { limit: number; cursor?: string }
): Promise<Page<ClientSummary>> {
	if (!mayListClients(caller.actor)) return refuseList(caller, 'client.listed');
	const studios = instructorStudioIds(caller.actor);
	const byName = query.sort === 'name';
	const after = decodeCursor(query.cursor, listCursors[byName ? 'name' : 'lastScreenedAt']);

	const where: SQL[] = [inStudios(studios)];
	if (query.search) where.push(ilike(clients.name, `%${escapeLike(query.search)}%`));
	if (query.needs) where.push(needsCondition(query.needs));

	// Oldest screening first (never screened before all), so who is due comes to the top.
	const lastKey = sql`coalesce(${clients.lastScreenedAt}, '-infinity'::timestamptz)`;
	if (after) {
		where.push(
			byName
				? sql`(${clients.name}, ${clients.id}) > (${after.k ?? ''}, ${after.id}::uuid)`
				: sql`(${lastKey}, ${clients.id}) > (${after.k ?? '-infinity'}::timestamptz, ${after.id}::uuid)`
		);
	}

	return db().transaction(async (tx) => {
		const rows = await tx
			.select()
			.from(clients)
			.where(and(...where))
			.orderBy(...(byName ? [asc(clients.name)] : [asc(lastKey)]), asc(clients.id))
			.limit(query.limit + 1);
		const page = toPage(rows, query.limit, (last) => ({
			k: byName ? last.name : (last.lastScreenedAt?.toISOString() ?? null),
			id: last.id
		}));
		await recordAccesses(
			tx,
			caller.access,
			page.items.map((row) => ({
				action: 'client.listed' as const,
				outcome: 'success' as const,
				target: { type: 'client', id: row.id },
				clientId: row.id
			}))
		);
		// One batched load for the page's badges (see clearance/limits.ts).
		const limits = await loadEffectiveLimits(
			tx,
			page.items.map((row) => row.id),
			new Date().toISOString().slice(0, 10),
			{ selfReports: 'shared' }
		);
		return {
			items: page.items.map((row) => {
				const found = limits.get(row.id);
				return {
					...toSummary(row),
					...(found
						? { clearanceStatus: clearanceStatus({ ...found, effective: found.categories }) }
						: {})
				};
			}),
			nextCursor: page.nextCursor
		};
	});
}

/** Policy: mayReadClient (her studio's instructors, or herself). Audit: client.read. */
export async function getClient(caller: Caller, id: string): Promise<ClientDetail> {
	const row = await clientFor(caller, id, 'client.read', mayReadClient);
	await db().transaction((tx) =>
		recordAccess(tx, caller.access, {
			action: 'client.read',
			outcome: 'success',
			target: { type: 'client', id },
			clientId: id
		})
	);
	return toDetail(row);
}

/** Policy: studioForNewClient (an instructor of that studio). Audit: client.created. */
export async function createClient(
	caller: Caller,
	input: ClientCreateInput
): Promise<{ id: string }> {
	const studio = studioForNewClient(caller.actor, input.organisationId);
	if (studio === null) {
		await recordRefusal(caller.access, { action: 'client.created' });
		throw new ProblemError('forbidden', {
			detail:
				input.organisationId === undefined && instructorStudioIds(caller.actor).length > 1
					? 'You teach in several studios: say which one with organisationId.'
					: 'Only an instructor of the studio can add its clients.'
		});
	}
	return db().transaction(async (tx) => {
		const [row] = await tx
			.insert(clients)
			.values({
				organisationId: studio,
				...recordFields(input),
				...(input.intakeConsent
					? {
							intakeConsentAt: input.intakeConsent.at,
							intakeConsentMethod: input.intakeConsent.method,
							intakeConsentTakenBy: caller.actor.userId
						}
					: {}),
				createdBy: caller.actor.userId
			})
			.returning({ id: clients.id });
		const id = row!.id;
		await recordAccess(tx, caller.access, {
			action: 'client.created',
			outcome: 'success',
			target: { type: 'client', id },
			clientId: id
		});
		return { id };
	});
}

/** The record's own columns from validated fields; fields of the other stage are kept. */
function recordFields(input: z.infer<typeof clientFieldsSchema>) {
	const common = {
		name: input.name,
		email: input.email ?? null,
		birthYear: input.birthYear ?? null,
		notes: input.notes ?? null,
		stage: input.stage
	};
	if (input.stage === 'pregnant') return { ...common, dueDate: input.dueDate };
	return {
		...common,
		birthDate: input.birthDate,
		delivery: input.delivery,
		births: input.births,
		multiples: input.multiples,
		postnatalCheckOn: input.postnatalCheckOn ?? null,
		postnatalCleared: input.postnatalCleared ?? null
	};
}

/** The stored record as the API's input shape, so a patch can be merged and checked whole. */
function asInput(row: ClientRow): Record<string, unknown> {
	return {
		name: row.name,
		email: row.email,
		birthYear: row.birthYear,
		notes: row.notes,
		stage: row.stage,
		dueDate: row.dueDate ?? undefined,
		birthDate: row.birthDate ?? undefined,
		delivery: row.delivery ?? undefined,
		births: row.births ?? undefined,
		multiples: row.multiples ?? undefined,
		postnatalCheckOn: row.postnatalCheckOn,
		postnatalCleared: row.postnatalCleared
	};
}

/** Policy: mayWriteClient (her studio's instructors). Audit: client.updated. */
export async function updateClient(
	caller: Caller,
	id: string,
	patch: ClientPatchInput
): Promise<ClientDetail> {
	const row = await clientFor(caller, id, 'client.updated', mayWriteClient);
	const { intakeConsent, ...fields } = patch;
	const merged = { ...asInput(row), ...stripUndefined(fields) };
	const parsed = clientFieldsSchema.safeParse(merged);
	if (!parsed.success) throw validationProblem(parsed.error);
	return db().transaction(async (tx) => {
		const [updated] = await tx
			.update(clients)
			.set({
				...recordFields(parsed.data),
				...(intakeConsent
					? {
							intakeConsentAt: intakeConsent.at,
							intakeConsentMethod: intakeConsent.method,
							intakeConsentTakenBy: caller.actor.userId
						}
					: {}),
				updatedAt: new Date()
			})
			.where(eq(clients.id, id))
			.returning();
		await recordAccess(tx, caller.access, {
			action: 'client.updated',
			outcome: 'success',
			target: { type: 'client', id },
			clientId: id
		});
		return toDetail(updated!);
	});
}

function stripUndefined<T extends Record<string, unknown>>(value: T): Partial<T> {
	return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as Partial<T>;
}

/**
 * Policy: mayWriteClient, and her intake consent recorded (else 409 intake-consent-required);
 * a screening dated before that consent is refused (422, /takenAt). Audit: screening.recorded.
 */
export async function recordScreening(
	caller: Caller,
	clientId: string,
	input: ScreeningInputData
): Promise<RecordedScreening> {
	const client = await clientFor(caller, clientId, 'screening.recorded', mayWriteClient);
	if (client.intakeConsentAt === null) {
		await recordRefusal(caller.access, {
			action: 'screening.recorded',
			target: { type: 'client', id: clientId },
			clientId
		});
		throw new ProblemError('intake-consent-required', {
			detail:
				'Record her intake consent — that she agreed to the studio recording her screenings — before the first screening.'
		});
	}
	let record;
	try {
		assertNotBeforeConsent(input.takenAt, client.intakeConsentAt);
		record = buildScreeningRecord(client, input);
	} catch (error) {
		if (!(error instanceof ScreeningDateError)) throw error;
		throw new ProblemError('validation-failed', {
			detail: `The screening date ${error.message}.`,
			errors: [{ pointer: '/takenAt', message: error.message }]
		});
	}
	return db().transaction(async (tx) => {
		const [row] = await tx
			.insert(screenings)
			.values({
				clientId,
				recordedBy: caller.actor.userId,
				...record,
				medicalSignResolved: input.medicalSignResolved ?? null
			})
			.returning({ id: screenings.id });
		await refreshLastScreening(tx, clientId);
		await recordAccess(tx, caller.access, {
			action: 'screening.recorded',
			outcome: 'success',
			target: { type: 'screening', id: row!.id },
			clientId
		});
		return {
			id: row!.id,
			outcome: record.outcome,
			reasons: record.reasons,
			warnings: record.warnings,
			stage: record.stage,
			weeksPostpartum: record.weeksPostpartum,
			weeksOfGestation: record.weeksOfGestation
		};
	});
}

/** Copies the newest screening's time and outcome onto the record (a late entry may not be it). */
async function refreshLastScreening(tx: Executor, clientId: string): Promise<void> {
	const [latest] = await tx
		.select({ takenAt: screenings.takenAt, outcome: screenings.outcome })
		.from(screenings)
		.where(eq(screenings.clientId, clientId))
		.orderBy(desc(screenings.takenAt), desc(screenings.createdAt))
		.limit(1);
	await tx
		.update(clients)
		.set({ lastScreenedAt: latest?.takenAt ?? null, lastOutcome: latest?.outcome ?? null })
		.where(eq(clients.id, clientId));
}

const screeningCursor = z.object({ t: z.iso.datetime(), id: z.uuid() });

/** Policy: mayReadClient. Audit: screening.read (one row for the page). */
export async function listScreenings(
	caller: Caller,
	clientId: string,
	query: { limit: number; cursor?: string }
): Promise<Page<ScreeningView> & { trend: TrendBySite }> {
	await clientFor(caller, clientId, 'screening.read', mayReadClient);
	const after = decodeCursor(query.cursor, screeningCursor);
	return db().transaction(async (tx) => {
		const rows = await tx
			.select()
			.from(screenings)
			.where(
				and(
					eq(screenings.clientId, clientId),
					after
						? sql`(${screenings.takenAt}, ${screenings.id}) < (${after.t}::timestamptz, ${after.id}::uuid)`
						: undefined
				)
			)
			.orderBy(desc(screenings.takenAt), desc(screenings.id))
			.limit(query.limit + 1);
		const widths = await tx
			.select({ takenAt: screenings.takenAt, sites: screenings.sites })
			.from(screenings)
			.where(eq(screenings.clientId, clientId));
		await recordAccess(tx, caller.access, {
			action: 'screening.read',
			outcome: 'success',
			target: { type: 'client', id: clientId },
			clientId
		});
		const page = toPage(rows, query.limit, (last) => ({
			t: last.takenAt.toISOString(),
			id: last.id
		}));
		return {
			items: page.items.map(toScreeningView),
			trend: trendBySite(widths),
			nextCursor: page.nextCursor
		};
	});
}

async function history(tx: Executor, clientId: string): Promise<ScreeningHistory> {
	const rows = await tx
		.select()
		.from(screenings)
		.where(eq(screenings.clientId, clientId))
		.orderBy(desc(screenings.takenAt), desc(screenings.id));
	return { items: rows.map(toScreeningView), trend: trendBySite(rows), series: chartSeries(rows) };
}

/** Policy: mayReadClient. Audit: screening.read. Every screening, for the chart and table. */
export async function getScreeningHistory(
	caller: Caller,
	clientId: string
): Promise<ScreeningHistory> {
	await clientFor(caller, clientId, 'screening.read', mayReadClient);
	return db().transaction(async (tx) => {
		const result = await history(tx, clientId);
		await recordAccess(tx, caller.access, {
			action: 'screening.read',
			outcome: 'success',
			target: { type: 'client', id: clientId },
			clientId
		});
		return result;
	});
}

/** Policy: mayReadOwnRecord (the person linked to the record). Audit: client.read, screening.read. */
export async function getOwnRecord(
	caller: Caller
): Promise<{ client: ClientDetail; history: ScreeningHistory }> {
	const actor = caller.actor;
	if (!mayReadOwnRecord(actor)) {
		await recordRefusal(caller.access, { action: 'client.read' });
		throw notFound('You have no client record in Seamwell.');
	}
	const row = await clientFor(caller, actor.clientId, 'client.read', mayReadClient);
	return db().transaction(async (tx) => {
		const result = await history(tx, row.id);
		await recordAccesses(
			tx,
			caller.access,
			(['client.read', 'screening.read'] as const).map((action) => ({
				action,
				outcome: 'success' as const,
				target: { type: 'client', id: row.id },
				clientId: row.id
			}))
		);
		return { client: toDetail(row), history: result };
	});
}

/**
 * Policy: mayWriteClient. Audit: invitation.sent. Links a person (created when new) with her
 * e-mail address to the record and queues a mail asking her to sign in.
 */
export async function inviteClientToSignIn(
	caller: Caller,
	clientId: string
): Promise<{ sentTo: string }> {
	const client = await clientFor(caller, clientId, 'invitation.sent', mayWriteClient);
	const address = client.email;
	if (!address) {
		throw new ProblemError('conflict', {
			detail: 'Add her e-mail address to the record before inviting her to sign in.'
		});
	}
	return db().transaction(async (tx) => {
		await tx
			.insert(users)
			.values({ email: address, name: client.name })
			.onConflictDoNothing({ target: users.email });
		const [person] = await tx.select().from(users).where(eq(users.email, address));
		const [linked] = await tx
			.select({ id: clients.id })
			.from(clients)
			.where(eq(clients.userId, person!.id));
		if (linked && linked.id !== clientId) {
			throw new ProblemError('conflict', {
				detail: 'This e-mail address already belongs to another client record.'
			});
		}
		await tx
			.update(clients)
			.set({ userId: person!.id, updatedAt: new Date() })
			.where(eq(clients.id, clientId));
		const studio = caller.actor.memberships.find((m) => m.organisationId === client.organisationId);
		await queueMail(tx, {
			to: address,
			kind: 'client.invitation',
			// No health details in a mail: what the record is about is for the signed-in page.
			subject: 'Your record in Seamwell',
			text: [
				`Hello ${client.name},`,
				'',
				`${studio?.organisationName ?? 'Your studio'} keeps your record in Seamwell. You can now see it yourself.`,
				'',
				`Sign in with this e-mail address at ${config().ORIGIN}/signin — we will send you a sign-in link.`,
				'',
				`Sent ${todayIso().slice(0, 10)} at the request of your instructor.`
			].join('\n')
		});
		await recordAccess(tx, caller.access, {
			action: 'invitation.sent',
			outcome: 'success',
			target: { type: 'client', id: clientId },
			clientId
		});
		return { sentTo: address };
	});
}

/**
 * Policy: her own setting (assertSelf). Audit: none (a preference, no client data). The factor
 * the viewing examiner's finger widths are shown at as an mm estimate — display only, never
 * read by a criterion (finger-width scores differ between raters: Bursch 1987).
 */
export async function examinerFactor(caller: Caller): Promise<FingerFactor> {
	assertSelf(caller.actor, caller.actor.userId);
	const [row] = await db()
		.select({ mmPerFinger: users.mmPerFinger })
		.from(users)
		.where(eq(users.id, caller.actor.userId));
	const own = row?.mmPerFinger ?? null;
	return own === null
		? { mmPerFinger: DEFAULT_MM_PER_FINGER, isDefault: true }
		: { mmPerFinger: own, isDefault: false };
}

/**
 * Policy: mayWriteClient. Audit: a refusal only (the write that follows logs its own row).
 * Forms call it before reading their fields, so nobody learns of a record from a form error.
 */
export async function assertMayWriteClient(caller: Caller, clientId: string): Promise<void> {
	await clientFor(caller, clientId, 'client.updated', mayWriteClient);
}

/**
 * Policy: mayListClients. Audit: a refusal only. Pages for adding or listing clients call it
 * before anything else.
 */
export async function assertMayKeepClients(caller: Caller): Promise<void> {
	if (!mayListClients(caller.actor)) {
		await recordRefusal(caller.access, { action: 'client.created' });
		throw notFound();
	}
}
