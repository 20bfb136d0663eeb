import {
	classifyScreening,
	earlyScreenWarnings,
	weeksOfGestation,
	weeksPostpartum,
	type EarlyScreenWarning,
	type RedFlag,
	type ScreeningResult,
	type Site,
	type SiteMeasure,
	type StageContext
} from '../../domain';
import { formatDate } from '$lib/dates';

/**
 * The version of the classification rules a stored outcome was decided by. Bump it whenever
 * src/lib/domain/screening.ts or its criteria change what a screening yields.
 */
export const SCREENING_RULES_VERSION = 'seamwell-screening-2025.1';

/** What the screening needs to know of the client's record. */
export interface ClientDates {
	stage: 'pregnant' | 'postpartum';
	dueDate: string | null;
	birthDate: string | null;
	postnatalCheckOn: string | null;
}

export class ScreeningDateError extends Error {}

const dayOf = (at: Date) => at.toISOString().slice(0, 10);

/**
 * A screening may not predate her intake consent (her agreement to the studio recording
 * screenings). Compared by calendar day (UTC, as the record's dates are shown), so a
 * screening on the day of the consent is fine whatever its hour.
 */
export function assertNotBeforeConsent(takenAt: Date, consentAt: Date): void {
	if (dayOf(takenAt) < dayOf(consentAt)) {
		throw new ScreeningDateError(
			`must not be before her intake consent on ${formatDate(consentAt)}`
		);
	}
}

/**
 * Her position in care on the day of the screening, from the record's dates. A postpartum
 * record screened before the birth (history entered late) reads as pregnancy. The postnatal
 * check counts as done when its date is on or before the screening's day; with no date
 * recorded it has not happened yet.
 */
export function stageContextAt(client: ClientDates, takenAt: Date): StageContext {
	const takenDay = dayOf(takenAt);
	if (client.stage === 'postpartum' && client.birthDate && takenDay >= client.birthDate) {
		return {
			stage: 'postpartum',
			weeksPostpartum: weeksPostpartum(client.birthDate, takenAt),
			postnatalCheckDone: client.postnatalCheckOn !== null && client.postnatalCheckOn <= takenDay
		};
	}
	if (client.dueDate === null) {
		if (client.stage === 'pregnant') throw new ScreeningDateError('her due date is missing');
		return { stage: 'pregnant' };
	}
	try {
		return { stage: 'pregnant', weeksOfGestation: weeksOfGestation(client.dueDate, takenAt) };
	} catch {
		throw new ScreeningDateError('is more than 40 weeks before her due date');
	}
}

export interface ScreeningRecordInput {
	takenAt: Date;
	sites: Record<Site, SiteMeasure>;
	redFlags: RedFlag[];
	notes?: string | null;
}

export interface ScreeningRecord {
	takenAt: Date;
	sites: Record<Site, SiteMeasure>;
	redFlags: RedFlag[];
	notes: string | null;
	stage: 'pregnant' | 'postpartum';
	weeksPostpartum: number | null;
	weeksOfGestation: number | null;
	postnatalCheckDone: boolean | null;
	outcome: ScreeningResult['outcome'];
	reasons: ScreeningResult['reasons'];
	warnings: EarlyScreenWarning[];
	rulesVersion: string;
}

/** Classifies a screening as of the day it was taken and shapes the row that keeps it. */
export function buildScreeningRecord(
	client: ClientDates,
	input: ScreeningRecordInput
): ScreeningRecord {
	const context = stageContextAt(client, input.takenAt);
	const sites = Object.fromEntries(
		(Object.entries(input.sites) as Array<[Site, SiteMeasure]>).map(([site, m]) => [
			site,
			{
				widthFingers: m.widthFingers,
				widthMm: m.widthMm ?? null,
				depth: m.depth,
				tension: m.tension,
				doming: m.doming
			}
		])
	) as Record<Site, SiteMeasure>;
	const result = classifyScreening({ sites, redFlags: input.redFlags, context });
	return {
		takenAt: input.takenAt,
		sites,
		redFlags: [...input.redFlags],
		notes: input.notes ?? null,
		stage: context.stage,
		weeksPostpartum: context.stage === 'postpartum' ? (context.weeksPostpartum ?? null) : null,
		weeksOfGestation: context.stage === 'pregnant' ? (context.weeksOfGestation ?? null) : null,
		postnatalCheckDone:
			context.stage === 'postpartum' ? (context.postnatalCheckDone ?? null) : null,
		outcome: result.outcome,
		reasons: result.reasons,
		warnings: earlyScreenWarnings(context),
		rulesVersion: SCREENING_RULES_VERSION
	};
}
