import type { ReferralClient, ReferralScreening } from '../../referrals/types';

// The copy of a client's record a clinic receives when a referral is sent. Pure shapes and
// the function that builds them, so the service, the schema and the tests share one form.
// Dates travel as ISO strings: the copy is JSON and must read back exactly as written.

/** The client details a physiotherapist needs to triage: no address, no contact details. */
export type SnapshotClient = ReferralClient;

/** One screening as the clinic receives it (dates as ISO strings). */
export type SnapshotScreening = ReferralScreening;

/** What the snapshot reads from the database: the same details, with real dates. */
type ClientRow = SnapshotClient;
type ScreeningRow = Omit<SnapshotScreening, 'takenAt'> & { takenAt: Date };

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
