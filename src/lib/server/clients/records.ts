import { clearanceStatus } from '$lib/clearance/words';
import { limitsForRecords } from '../clearance/limits';
import { and, asc, eq, ilike, sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import {
	clientFieldsSchema,
	type ClientCreateInput,
	type ClientListFilter,
	type ClientPatchInput
} from '$lib/clients/schemas';
import { recordAccess, recordSuccesses, recordRefusal } from '../audit';
import type { Caller } from '../context';
import { db } from '../db';
import { clients } from '../db/schema';
import { ProblemError, validationProblem } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { mayListClients, mayReadClient, mayWriteClient, studioForNewClient } from './policy';
import type { ClientDetail, ClientSummary } from '$lib/clients/types';
import {
	type ClientRow,
	clientFor,
	escapeLike,
	inStudios,
	listCursors,
	needsCondition,
	refuseList,
	toDetail,
	toSummary
} from './shared';
import { instructorStudioIds } from '../scope';

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
		await recordSuccesses(
			tx,
			caller.access,
			'client.listed',
			page.items.map((row) => ({
				target: { type: 'client', id: row.id },
				clientId: row.id
			}))
		);
		// One batched load for the page's badges (see clearance/limits.ts).
		const limits = await limitsForRecords(tx, page.items, new Date().toISOString().slice(0, 10), {
			selfReports: 'shared'
		});
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
