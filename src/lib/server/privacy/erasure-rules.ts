import type * as schema from '../db/schema';

// What erasing a client does to every table Seamwell has, one rule per table. The type below
// is derived from the schema, so a new table does not compile until it has a rule here; the
// integration test (erasure.int.test.ts) also lists the database's own tables and checks each
// against its rule after a real erasure.
//
// - `erased`: every row of hers is deleted (by erasure.ts directly or by a cascade from it).
// - `clinic`: the clinic's own record of a referral it received. GDPR Art. 17(3)(b) and (c):
//   a health professional's duty to keep clinical records overrides erasure, so the rows stay,
//   but the studio's link to her (her client id) is removed and the studio no longer sees them.
// - `log`: the append-only access log. Its rows stay (the database refuses to change them and
//   the seal chain must still verify); they name her only through her subject key, and the
//   key's row is deleted, so they no longer lead to her.
// - `receipt`: the studio's record that it answered the request: when, by whom, how many rows
//   of each kind — no name, no client id, no values.
// - `none`: holds nothing about a client (organisations, staff, exercises, plans' own rows).

export type ErasureRule =
	| { rule: 'erased'; what: string }
	| { rule: 'clinic'; what: string }
	| { rule: 'log'; what: string }
	| { rule: 'receipt'; what: string }
	| { rule: 'none'; what: string };

type Schema = typeof schema;
/** The SQL name of every table the schema declares. */
export type TableName = {
	[K in keyof Schema]: Schema[K] extends { _: { name: infer N extends string; columns: object } }
		? N
		: never;
}[keyof Schema];

export const ERASURE_RULES: Record<TableName, ErasureRule> = {
	clients: { rule: 'erased', what: 'Her client record.' },
	screenings: { rule: 'erased', what: 'Every screening the studio recorded.' },
	consents: { rule: 'erased', what: 'Her grants to share with clinics.' },
	consent_events: { rule: 'erased', what: 'The history of her grants.' },
	consent_requests: { rule: 'erased', what: "Her instructors' requests for consent." },
	self_checks: { rule: 'erased', what: 'Her own checks.' },
	self_check_sharing: { rule: 'erased', what: 'Whether she shared her checks.' },
	home_practices: { rule: 'erased', what: 'Her home practice.' },
	home_practice_sessions: { rule: 'erased', what: 'The sessions she logged.' },
	home_practice_reminders: { rule: 'erased', what: 'Her reminder settings.' },
	plan_clients: { rule: 'erased', what: 'Her place in session plans.' },
	plans: {
		rule: 'erased',
		what: "Her cells in each plan's last readiness check (the plan itself is the studio's)."
	},
	plan_overrides: {
		rule: 'erased',
		what: 'Her cells in recorded overrides; an override left with no cells goes with them.'
	},
	clearance_review_requests: { rule: 'erased', what: "The studio's review requests about her." },
	referral_list_views: {
		rule: 'erased',
		what: 'Which of her referrals the studio had seen in its lists.'
	},
	users: { rule: 'erased', what: 'Her sign-in (unless the same person also works somewhere).' },
	accounts: { rule: 'erased', what: 'Her sign-in providers.' },
	sessions: { rule: 'erased', what: 'Her open sessions: she is signed out everywhere.' },
	verification_tokens: { rule: 'erased', what: 'Unused sign-in links to her address.' },
	rate_limit_hits: { rule: 'erased', what: 'Sign-in attempts counted against her address.' },
	invitations: { rule: 'erased', what: 'Invitations sent to her address by the studio.' },
	outbox: {
		rule: 'erased',
		what: 'Mail to her address. The confirmation of the erasure forgets the address once sent.'
	},
	subject_keys: { rule: 'erased', what: 'The only link from the access log to her.' },
	referrals: {
		rule: 'clinic',
		what: 'Referrals the clinic received stay with the clinic, unlinked from her record; drafts the studio never sent are deleted.'
	},
	referral_events: { rule: 'clinic', what: "The history of the clinic's referrals." },
	referral_snapshots: {
		rule: 'clinic',
		what: 'What the clinic received when the referral was sent (its own copy).'
	},
	assessments: { rule: 'clinic', what: "The physiotherapist's findings." },
	clearances: { rule: 'clinic', what: "The clinic's clearances, no longer seen by the studio." },
	documents: {
		rule: 'clinic',
		what: "The clinic's assessment documents; the studio loses access (files stay in the clinic's store)."
	},
	access_log: {
		rule: 'log',
		what: 'Every access stays on record under a key that maps to nothing.'
	},
	access_log_seals: { rule: 'log', what: 'The seal chain, unchanged.' },
	erasure_requests: {
		rule: 'receipt',
		what: 'The request itself: dates, who decided, counts of what went — no name, no client id.'
	},
	organisations: { rule: 'none', what: 'Studios and clinics.' },
	memberships: { rule: 'none', what: 'Staff and their roles.' },
	studio_exercises: { rule: 'none', what: "The studio's exercise library." }
};
