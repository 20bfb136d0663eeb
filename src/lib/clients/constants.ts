// The client record's fixed lists and labels, without zod: pages import these, and a page
// that only needs a label must not load the schemas (see ./schemas.ts, which re-exports them).

export const DELIVERIES = ['vaginal', 'caesarean'] as const;
export const CONSENT_METHODS = ['in_person', 'signed_form', 'online'] as const;
export type ConsentMethod = (typeof CONSENT_METHODS)[number];

export const CONSENT_METHOD_LABELS: Record<ConsentMethod, string> = {
	in_person: 'In person',
	signed_form: 'Signed form',
	online: 'Online'
};

export const NEEDS = ['referral', 'screening'] as const;
export type Needs = (typeof NEEDS)[number];
export const CLIENT_SORTS = ['name', 'lastScreenedAt'] as const;
export type ClientSort = (typeof CLIENT_SORTS)[number];

/** "Needs a screening": none in this many weeks (or never). */
export const SCREENING_DUE_WEEKS = 8;
