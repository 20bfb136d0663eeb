import { and, desc, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import { chartSeries } from '$lib/domain';
import { type ScreeningInputData } from '$lib/clients/schemas';
import { recordAccess, recordAccesses, recordRefusal } from '../audit';
import type { Caller } from '../context';
import { db, type Executor } from '../db';
import { clients, screenings } from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { mayReadClient, mayReadOwnRecord, mayWriteClient } from './policy';
import {
	assertNotBeforeConsent,
	buildScreeningRecord,
	ScreeningDateError
} from './screening-record';
import type {
	ClientDetail,
	RecordedScreening,
	ScreeningHistory,
	ScreeningView,
	TrendBySite
} from '$lib/clients/types';
import { clientFor, toDetail, toScreeningView, trendBySite } from './shared';

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
