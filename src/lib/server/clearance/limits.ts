import { asc, desc, eq, inArray, sql } from 'drizzle-orm';
import { effectiveLimits } from '../../domain/limits';
import type {
	EffectiveLimits,
	LimitsClearance,
	LimitsClient,
	LimitsScreening
} from '../../domain/movement';
import type { Executor } from '../db';
import { recalledLimits, rememberLimits, type SelfReportScope } from './limits-memo';
import {
	clearances,
	clients,
	homePracticeSessions,
	organisations,
	screenings,
	selfChecks,
	selfCheckSharing,
	users
} from '../db/schema';
import type { LimitsSelfReport } from '../../domain/movement';

// Builds the inputs of `effectiveLimits` (src/lib/domain/limits.ts) from the database, for
// many clients at once: one query each for the records, their screenings and their current
// clearances, however many clients a plan or a list holds. Not caller-facing: the calling
// service has asserted its own policy and records its own access.

type ClientRow = typeof clients.$inferSelect;
type ScreeningRow = typeof screenings.$inferSelect;
type ClearanceRow = typeof clearances.$inferSelect;

export function limitsClient(row: ClientRow): LimitsClient {
	return {
		stage: row.stage,
		dueDate: row.dueDate,
		birthDate: row.birthDate,
		delivery: row.delivery,
		postnatalCheckOn: row.postnatalCheckOn,
		postnatalCleared: row.postnatalCleared
	};
}

/** The screening columns the limits read: no notes, warnings or rules version on this path. */
const limitsColumns = {
	id: screenings.id,
	clientId: screenings.clientId,
	takenAt: screenings.takenAt,
	createdAt: screenings.createdAt,
	stage: screenings.stage,
	sites: screenings.sites,
	redFlags: screenings.redFlags,
	outcome: screenings.outcome,
	reasons: screenings.reasons,
	medicalSignResolved: screenings.medicalSignResolved
};

export function limitsScreening(
	row: Pick<
		ScreeningRow,
		| 'id'
		| 'takenAt'
		| 'createdAt'
		| 'stage'
		| 'sites'
		| 'redFlags'
		| 'outcome'
		| 'reasons'
		| 'medicalSignResolved'
	>
): LimitsScreening {
	return {
		id: row.id,
		takenAt: row.takenAt,
		recordedAt: row.createdAt,
		stage: row.stage,
		sites: row.sites,
		redFlags: row.redFlags,
		outcome: row.outcome,
		reasons: row.reasons,
		...(row.medicalSignResolved === null ? {} : { medicalSignResolved: row.medicalSignResolved })
	};
}

export function limitsClearance(
	row: ClearanceRow,
	names: { setByName: string | null; clinicName: string }
): LimitsClearance {
	return {
		id: row.id,
		setAt: row.setAt,
		stageAtSet: row.stageAtSet,
		levels: row.levels,
		modifications: row.modifications,
		reviewOn: row.reviewOn,
		setByName: names.setByName ?? 'a physiotherapist',
		clinicName: names.clinicName,
		knownUntil: row.knownUntil,
		sharingEndedOn: row.sharingEndedOn
	};
}

/** Each client's current clearance (the newest one set), with who set it and where. */
export async function currentClearances(
	tx: Executor,
	clientIds: readonly string[],
	options: { clinicId?: string } = {}
): Promise<Map<string, LimitsClearance & { row: ClearanceRow }>> {
	const found = new Map<string, LimitsClearance & { row: ClearanceRow }>();
	if (clientIds.length === 0) return found;
	const rows = await tx
		.selectDistinctOn([clearances.clientId], {
			clearance: clearances,
			setByName: users.name,
			clinicName: organisations.name
		})
		.from(clearances)
		.innerJoin(organisations, eq(organisations.id, clearances.clinicId))
		.leftJoin(users, eq(users.id, clearances.setBy))
		.where(
			options.clinicId
				? sql`${inArray(clearances.clientId, [...clientIds])} and ${eq(clearances.clinicId, options.clinicId)}`
				: inArray(clearances.clientId, [...clientIds])
		)
		.orderBy(asc(clearances.clientId), desc(clearances.setAt), desc(clearances.id));
	for (const r of rows) {
		if (r.clearance.clientId === null) continue; // the studio erased her (never asked for)
		found.set(r.clearance.clientId, { ...limitsClearance(r.clearance, r), row: r.clearance });
	}
	return found;
}

/**
 * Effective movement limits for each client, as of `today` (YYYY-MM-DD): the records, then —
 * for those not already in the memo under their current limits version — their screenings,
 * clearances and self-reports, and the pure rules. Clients that do not exist are left out.
 */
export async function loadEffectiveLimits(
	tx: Executor,
	clientIds: string[],
	today: string,
	options: {
		/**
		 * Her self-reported symptoms: `shared` for the studio (only while she shares her
		 * self-checks with her studio), `all` for her own view, `none` otherwise.
		 */
		selfReports?: SelfReportScope;
	} = {}
): Promise<Map<string, EffectiveLimits>> {
	const ids = [...new Set(clientIds)];
	if (ids.length === 0) return new Map();
	const records = await tx.select().from(clients).where(inArray(clients.id, ids));
	return limitsForRecords(tx, records, today, options);
}

/**
 * As `loadEffectiveLimits`, for client rows the caller has just read in the same transaction
 * (a list page, a plan's roster): one statement fewer.
 */
export async function limitsForRecords(
	tx: Executor,
	records: readonly ClientRow[],
	today: string,
	options: { selfReports?: SelfReportScope } = {}
): Promise<Map<string, EffectiveLimits>> {
	const result = new Map<string, EffectiveLimits>();
	const scope = options.selfReports ?? 'none';
	const missing: ClientRow[] = [];
	for (const record of records) {
		const known = recalledLimits(record.id, record.limitsVersion, today, scope);
		if (known) result.set(record.id, known);
		else missing.push(record);
	}
	if (missing.length === 0) return result;
	// Read after the versions: what is read is at least as new as the version it is kept under.
	const missingIds = missing.map((record) => record.id);
	const history = await tx
		.select(limitsColumns)
		.from(screenings)
		.where(inArray(screenings.clientId, missingIds))
		.orderBy(asc(screenings.takenAt), asc(screenings.id));
	const current = await currentClearances(tx, missingIds);
	const byClient = new Map<string, LimitsScreening[]>();
	for (const row of history) {
		const list = byClient.get(row.clientId) ?? [];
		list.push(limitsScreening(row));
		byClient.set(row.clientId, list);
	}
	const reports = await selfReportsFor(tx, missing, scope);
	for (const record of missing) {
		const limits = effectiveLimits(
			limitsClient(record),
			byClient.get(record.id) ?? [],
			current.get(record.id) ?? null,
			today,
			reports.get(record.id) ?? []
		);
		result.set(record.id, rememberLimits(record.id, record.limitsVersion, today, scope, limits));
	}
	return result;
}

/** Self-reported symptoms (self-checks and practice sessions) per client, as asked. */
export async function selfReportsFor(
	tx: Executor,
	records: ReadonlyArray<ClientRow>,
	which: 'shared' | 'all' | 'none'
): Promise<Map<string, LimitsSelfReport[]>> {
	const found = new Map<string, LimitsSelfReport[]>();
	if (which === 'none' || records.length === 0) return found;
	let ids = records.map((r) => r.id);
	if (which === 'shared') {
		const sharing = await tx
			.select({
				clientId: selfCheckSharing.clientId,
				organisationId: selfCheckSharing.organisationId
			})
			.from(selfCheckSharing)
			.where(sql`${inArray(selfCheckSharing.clientId, ids)} and ${selfCheckSharing.shared}`);
		const studioOf = new Map(records.map((r) => [r.id, r.organisationId]));
		ids = sharing
			.filter((s) => studioOf.get(s.clientId) === s.organisationId)
			.map((s) => s.clientId);
		if (ids.length === 0) return found;
	}
	const checks = await tx
		.select({
			id: selfChecks.id,
			clientId: selfChecks.clientId,
			takenAt: selfChecks.takenAt,
			symptoms: selfChecks.symptoms
		})
		.from(selfChecks)
		.where(inArray(selfChecks.clientId, ids));
	const sessions = await tx
		.select({
			id: homePracticeSessions.id,
			clientId: homePracticeSessions.clientId,
			takenAt: homePracticeSessions.doneAt,
			symptoms: homePracticeSessions.symptoms
		})
		.from(homePracticeSessions)
		.where(inArray(homePracticeSessions.clientId, ids));
	for (const row of [...checks, ...sessions]) {
		const list = found.get(row.clientId) ?? [];
		list.push({ id: row.id, takenAt: row.takenAt, symptoms: row.symptoms });
		found.set(row.clientId, list);
	}
	return found;
}
