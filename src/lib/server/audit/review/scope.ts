import { sql, type SQL } from 'drizzle-orm';
import type { OrganisationKind } from '../../actor';

// Which access-log events an organisation's admin may review: events by members acting for
// her organisation, and events by anyone on records her organisation holds. "Holds" is a
// table, one entry per kind of organisation and target type, each a query for the ids of
// such records the organisation holds. A feature that logs a new target type (clearances,
// plans …) adds its line here and its events come into scope; nothing else changes.

/** Selects the ids (as text, like access_log.target_id) of records of one type `org` holds. */
type HeldIds = (org: string) => SQL;

export const HELD_RECORDS: Record<OrganisationKind, Record<string, HeldIds>> = {
	studio: {
		// Its own client records and their screenings.
		client: (org) => sql`select c.id::text from clients c where c.organisation_id = ${org}`,
		screening: (org) =>
			sql`select s.id::text from screenings s join clients c on c.id = s.client_id
				where c.organisation_id = ${org}`,
		// The referrals it opened, drafts included.
		referral: (org) => sql`select r.id::text from referrals r where r.studio_id = ${org}`,
		// Its clients' grants to share with a clinic.
		consent: (org) => sql`select g.id::text from consents g where g.studio_id = ${org}`
	},
	clinic: {
		// The referrals it received (a draft was never sent to it) and their documents.
		referral: (org) =>
			sql`select r.id::text from referrals r where r.clinic_id = ${org} and r.state <> 'draft'`,
		document: (org) =>
			sql`select d.id::text from documents d join referrals r on r.id = d.referral_id
				where r.clinic_id = ${org}`,
		// Grants that name it.
		consent: (org) => sql`select g.id::text from consents g where g.clinic_id = ${org}`
	}
};

/**
 * The clients whose names an admin of `org` may see beside an event: a studio's own
 * clients; for a clinic, the clients of the referrals it received. Everyone else is "a
 * client of another organisation".
 */
export const HELD_CLIENTS: Record<OrganisationKind, (org: string) => SQL> = {
	studio: (org) => sql`select c.id from clients c where c.organisation_id = ${org}`,
	clinic: (org) =>
		sql`select r.client_id from referrals r where r.clinic_id = ${org} and r.state <> 'draft'`
};

export interface ReviewScope {
	organisationId: string;
	kind: OrganisationKind;
}

/**
 * The WHERE condition for "this event is in her scope", over `access_log l`. Each held type
 * is one `target_type = … and target_id = any(array(…))` arm: the array is computed once
 * per query (an InitPlan), so every arm is an index condition on (target_type, target_id).
 */
export function inScope(scope: ReviewScope): SQL {
	const arms = Object.entries(HELD_RECORDS[scope.kind]).map(
		([type, held]) =>
			sql`(l.target_type = ${type} and l.target_id = any(array(${held(scope.organisationId)})))`
	);
	return sql`(l.actor_organisation_id = ${scope.organisationId} or ${sql.join(arms, sql` or `)})`;
}

/** True (SQL) when the client `clientIdExpr` is one the organisation holds. */
export function holdsClient(scope: ReviewScope, clientIdExpr: SQL): SQL {
	return sql`${clientIdExpr} in (${HELD_CLIENTS[scope.kind](scope.organisationId)})`;
}
