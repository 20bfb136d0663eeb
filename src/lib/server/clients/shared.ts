import { eq, isNull, lt, or, sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import {
	screeningTrend,
	weeksOfGestation,
	weeksPostpartum,
	type SiteTrend,
	type SiteTrendPoint
} from '$lib/domain';
import { SCREENING_DUE_WEEKS, type ClientListFilter } from '$lib/clients/schemas';
import { recordRefusal, type AuditAction } from '../audit';
import type { Caller } from '../context';
import { db, type Executor } from '../db';
import { readOnce } from '../db/scope';
import { clients, screenings } from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { cursorKey } from '../http/schemas';
import { mayReadClient } from './policy';
import type {
	ClientDetail,
	ClientSummary,
	ScreeningView,
	TrendBySite,
	TrendView
} from '$lib/clients/types';

// What the client modules (records, screenings, access) share: row types, the views they
// answer with, trends, the record behind its policy check and the list's SQL pieces.

export type ClientRow = typeof clients.$inferSelect;
type ScreeningRow = typeof screenings.$inferSelect;

export const todayIso = () => new Date().toISOString();

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

export function toSummary(row: ClientRow): ClientSummary {
	return {
		id: row.id,
		name: row.name,
		email: row.email,
		stage: row.stage,
		lastScreenedAt: row.lastScreenedAt?.toISOString() ?? null,
		lastOutcome: row.lastOutcome
	};
}

export function toDetail(row: ClientRow): ClientDetail {
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

export function toScreeningView(row: ScreeningRow): ScreeningView {
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

export function trendBySite(
	rows: ReadonlyArray<Pick<ScreeningRow, 'takenAt' | 'sites'>>
): TrendBySite {
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
/** Her row, read once per page load when several services of the page check it. */
export async function clientRow(
	id: string,
	executor: Executor = db()
): Promise<ClientRow | undefined> {
	return readOnce(`client:${id}`, async () => {
		const [row] = await executor.select().from(clients).where(eq(clients.id, id));
		return row;
	});
}

export async function clientFor(
	caller: Caller,
	id: string,
	action: AuditAction,
	rule: typeof mayReadClient
): Promise<ClientRow> {
	const row = await clientRow(id);
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

export async function refuseList(caller: Caller, action: AuditAction): Promise<never> {
	await recordRefusal(caller.access, { action });
	throw new ProblemError('forbidden', {
		detail: 'Client records are kept by the instructors of a studio.'
	});
}

/** The list's cursor: the last row's sort key (a name, or when she was last screened) and id. */
export const listCursors = {
	name: z.strictObject({ k: cursorKey.text, id: cursorKey.id }),
	lastScreenedAt: z.strictObject({ k: cursorKey.moment.nullable(), id: cursorKey.id })
};

export function escapeLike(term: string): string {
	return term.replace(/[\\%_]/g, (c) => `\\${c}`);
}

/** The `needs` filters, shared by the list and the dashboard's counts so both agree. */
export function needsCondition(needs: NonNullable<ClientListFilter['needs']>): SQL {
	if (needs === 'referral') return eq(clients.lastOutcome, 'refer');
	const due = new Date(Date.now() - SCREENING_DUE_WEEKS * 7 * 86_400_000);
	return or(isNull(clients.lastScreenedAt), lt(clients.lastScreenedAt, due))!;
}

/** Her studios as an SQL condition on the client's organisation. */
export function inStudios(studios: readonly string[]): SQL {
	return sql`${clients.organisationId} in (${sql.join(
		studios.map((s) => sql`${s}::uuid`),
		sql`, `
	)})`;
}
