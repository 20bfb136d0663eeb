import type { Outcome, ScreeningReason } from '../../domain/screening';
import type { RedFlag } from '../../domain/red-flags';
import type { Site, SiteMeasure } from '../../domain/sites';

// The copy of a client's record a clinic receives when a referral is sent. Pure shapes and
// the function that builds them, so the service, the schema and the tests share one form.
// Dates travel as ISO strings: the copy is JSON and must read back exactly as written.

/** The client details a physiotherapist needs to triage: no address, no contact details. */
export interface SnapshotClient {
	name: string;
	birthYear: number | null;
	stage: 'pregnant' | 'postpartum';
	dueDate: string | null;
	birthDate: string | null;
	delivery: 'vaginal' | 'caesarean' | null;
	births: number | null;
	multiples: boolean | null;
	postnatalCheckOn: string | null;
	postnatalCleared: boolean | null;
}

export interface SnapshotScreening {
	id: string;
	takenAt: string;
	sites: Record<Site, SiteMeasure>;
	redFlags: RedFlag[];
	notes: string | null;
	stage: 'pregnant' | 'postpartum';
	weeksPostpartum: number | null;
	weeksOfGestation: number | null;
	outcome: Outcome;
	reasons: ScreeningReason[];
}

export interface ClientRow {
	name: string;
	birthYear: number | null;
	stage: 'pregnant' | 'postpartum';
	dueDate: string | null;
	birthDate: string | null;
	delivery: 'vaginal' | 'caesarean' | null;
	births: number | null;
	multiples: boolean | null;
	postnatalCheckOn: string | null;
	postnatalCleared: boolean | null;
}

export interface ScreeningRow {
	id: string;
	takenAt: Date;
	sites: Record<Site, SiteMeasure>;
	redFlags: RedFlag[];
	notes: string | null;
	stage: 'pregnant' | 'postpartum';
	weeksPostpartum: number | null;
	weeksOfGestation: number | null;
	outcome: Outcome;
	reasons: ScreeningReason[];
}

export function snapshotClient(client: ClientRow): SnapshotClient {
	return {
		name: client.name,
		birthYear: client.birthYear,
		stage: client.stage,
		dueDate: client.dueDate,
		birthDate: client.birthDate,
		delivery: client.delivery,
		births: client.births,
		multiples: client.multiples,
		postnatalCheckOn: client.postnatalCheckOn,
		postnatalCleared: client.postnatalCleared
	};
}

/** Oldest first, as the chart and the history table read them. */
export function snapshotScreenings(rows: readonly ScreeningRow[]): SnapshotScreening[] {
	return [...rows]
		.sort((a, b) => a.takenAt.getTime() - b.takenAt.getTime())
		.map((row) => ({
			id: row.id,
			takenAt: row.takenAt.toISOString(),
			sites: row.sites,
			redFlags: [...row.redFlags],
			notes: row.notes,
			stage: row.stage,
			weeksPostpartum: row.weeksPostpartum,
			weeksOfGestation: row.weeksOfGestation,
			outcome: row.outcome,
			reasons: row.reasons
		}));
}
