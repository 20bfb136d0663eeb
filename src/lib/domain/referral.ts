// A referral's life as data: its states, who may move it from one to the next, and what each
// move needs. Pure; the referral service and the pages both read this table, and the
// integration tests check the server against an expected table written out by hand.

import { SEND_SCOPES, type ShareScope } from './consent';

export const REFERRAL_STATES = [
	'draft',
	'sent',
	'accepted',
	'declined',
	'assessed',
	'closed',
	'withdrawn'
] as const;
export type ReferralState = (typeof REFERRAL_STATES)[number];

export const URGENCIES = ['routine', 'soon'] as const;
export type Urgency = (typeof URGENCIES)[number];

export const URGENCY_LABELS: Record<Urgency, string> = {
	routine: 'Routine',
	soon: 'Soon'
};

export const REFERRAL_STATE_LABELS: Record<ReferralState, string> = {
	draft: 'Draft',
	sent: 'Sent',
	accepted: 'Accepted',
	declined: 'Declined',
	assessed: 'Assessed',
	closed: 'Closed',
	withdrawn: 'Withdrawn'
};

/** The same states in words for the client herself. */
export const REFERRAL_STATE_PLAIN: Record<ReferralState, string> = {
	draft: 'being prepared by your studio',
	sent: 'sent, waiting for the clinic to answer',
	accepted: 'accepted by the clinic',
	declined: 'declined by the clinic',
	assessed: 'you have been assessed',
	closed: 'closed',
	withdrawn: 'ended'
};

/**
 * Who makes a move:
 * - `studio_instructor`: an instructor of the referring studio;
 * - `clinic_physio`: a physiotherapist of the receiving clinic — the named one, if one is named;
 * - `assigned_physio`: the physiotherapist who accepted it.
 */
export type TransitionActor = 'studio_instructor' | 'clinic_physio' | 'assigned_physio';

export interface Transition {
	from: ReferralState;
	to: ReferralState;
	by: TransitionActor;
	/** A reason must be given (trimmed, non-empty). */
	reasonRequired: boolean;
	/** Scopes of consent to share that must be in force at the moment of the move. */
	consent: readonly ShareScope[];
}

const ACT_SCOPES: readonly ShareScope[] = ['referral'];
const NONE: readonly ShareScope[] = [];

/** Every allowed move. Anything not listed here is refused. */
export const TRANSITIONS: readonly Transition[] = [
	{
		from: 'draft',
		to: 'sent',
		by: 'studio_instructor',
		reasonRequired: false,
		consent: SEND_SCOPES
	},
	{ from: 'draft', to: 'withdrawn', by: 'studio_instructor', reasonRequired: true, consent: NONE },
	{ from: 'sent', to: 'withdrawn', by: 'studio_instructor', reasonRequired: true, consent: NONE },
	{
		from: 'accepted',
		to: 'withdrawn',
		by: 'studio_instructor',
		reasonRequired: true,
		consent: NONE
	},
	// The clinic acts on a referral only while the client's consent lasts.
	{ from: 'sent', to: 'accepted', by: 'clinic_physio', reasonRequired: false, consent: ACT_SCOPES },
	{ from: 'sent', to: 'declined', by: 'clinic_physio', reasonRequired: true, consent: ACT_SCOPES },
	// Until assessments exist, "assessed" is recorded with a note in place of the findings.
	{
		from: 'accepted',
		to: 'assessed',
		by: 'assigned_physio',
		reasonRequired: false,
		consent: ACT_SCOPES
	},
	// Closing shares nothing new: it only files the record away.
	{ from: 'assessed', to: 'closed', by: 'assigned_physio', reasonRequired: false, consent: NONE }
];

/** The states a move can lead to (a referral is only ever created as a draft). */
export const TRANSITION_TARGETS = [...new Set(TRANSITIONS.map((t) => t.to))] as ReferralState[];

/** States the clinic still acts on: withdrawing consent moves these to withdrawn. */
export const OPEN_SHARED_STATES: readonly ReferralState[] = ['sent', 'accepted'];

/** States the clinic sees: everything but drafts (a clinic never sees a draft). */
export const CLINIC_VISIBLE_STATES: readonly ReferralState[] = REFERRAL_STATES.filter(
	(s) => s !== 'draft'
);

export const CONSENT_WITHDRAWN_REASON = 'consent withdrawn';

export function isReferralState(value: string): value is ReferralState {
	return (REFERRAL_STATES as readonly string[]).includes(value);
}

export function isUrgency(value: string): value is Urgency {
	return (URGENCIES as readonly string[]).includes(value);
}

/** The move from `from` to `to`, or null when the table has none. */
export function findTransition(from: ReferralState, to: ReferralState): Transition | null {
	return TRANSITIONS.find((t) => t.from === from && t.to === to) ?? null;
}

/** Who may ever lead a referral into `to` (from whichever state). */
export function actorsInto(to: ReferralState): TransitionActor[] {
	return [...new Set(TRANSITIONS.filter((t) => t.to === to).map((t) => t.by))];
}

/** The moves out of `from` that one of `roles` may make, in table order. */
export function transitionsFrom(
	from: ReferralState,
	roles: readonly TransitionActor[]
): Transition[] {
	return TRANSITIONS.filter((t) => t.from === from && roles.includes(t.by));
}

/** A state no move leaves. */
export function isFinalState(state: ReferralState): boolean {
	return !TRANSITIONS.some((t) => t.from === state);
}

/** Sorting by urgency: the sooner, the higher. */
export const URGENCY_RANK: Record<Urgency, number> = { soon: 0, routine: 1 };
