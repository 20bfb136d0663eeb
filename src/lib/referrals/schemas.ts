import { z } from 'zod';
import { text, requiredText, nullableText } from '$lib/schemas/text';
import { SHARE_SCOPES } from '$lib/domain/consent';
import { RED_FLAGS } from '$lib/domain/red-flags';
import { REFERRAL_STATES, TRANSITION_TARGETS, URGENCIES } from '$lib/domain/referral';

// Input schemas for consents and referrals, shared by the JSON API, the form actions and the
// browser (so this module stays free of server imports).

/** Empty or missing is null; otherwise trimmed text. */

const id = (what: string) => z.uuid({ error: `must be ${what} id` });

/** A future moment: a full timestamp with offset, or a day (the consent ends at its start, UTC). */
const endsAt = z
	.union([z.iso.datetime({ offset: true }), z.iso.date()], {
		error: 'must be a date (YYYY-MM-DD) or a date and time with its offset'
	})
	.transform((value) => new Date(value.length === 10 ? `${value}T00:00:00Z` : value));

/** POST /api/v1/consents (the client) and her consent form. */
export const giveConsentSchema = z.object({
	clinicId: id('a clinic'),
	scopes: z
		.array(z.enum(SHARE_SCOPES, { error: `must be one of ${SHARE_SCOPES.join(', ')}` }), {
			error: 'must be a list of scopes'
		})
		.min(1, 'choose at least one thing to share')
		.max(SHARE_SCOPES.length)
		.transform((scopes) => [...new Set(scopes)]),
	endsAt: endsAt.nullable().optional()
});
export type GiveConsentData = z.infer<typeof giveConsentSchema>;

/** POST /api/v1/consent-requests (an instructor). */
export const consentRequestSchema = z.object({
	clientId: id('a client'),
	clinicId: id('a clinic')
});

/** POST /api/v1/referrals and the new-referral form. */
export const openReferralSchema = z.object({
	clientId: id('a client'),
	clinicId: id('a clinic'),
	physioId: id('a physiotherapist').nullable().optional(),
	reason: requiredText(4000),
	urgency: z.enum(URGENCIES, { error: `must be one of ${URGENCIES.join(', ')}` }),
	redFlags: z
		.array(z.enum(RED_FLAGS, { error: 'unknown red-flag code' }), {
			error: 'must be a list of red-flag codes'
		})
		.max(RED_FLAGS.length)
		.default([])
		.transform((flags) => [...new Set(flags)]),
	/** Needed only when she already has a sent or accepted referral to the same clinic. */
	duplicateReason: text(2000)
		.transform((s) => s.trim() || null)
		.nullish()
});
export type OpenReferralData = z.infer<typeof openReferralSchema>;

/** POST /api/v1/referrals/{id}/transitions and the referral page's actions. */
export const transitionSchema = z.object({
	to: z.enum(TRANSITION_TARGETS as [string, ...string[]], {
		error: `must be one of ${TRANSITION_TARGETS.join(', ')}`
	}),
	reason: nullableText(4000)
});
export type TransitionData = z.infer<typeof transitionSchema>;

export const REFERRAL_SORTS = ['date', 'urgency'] as const;
export type ReferralSort = (typeof REFERRAL_SORTS)[number];

/** GET /api/v1/referrals filters: `state` takes one state or several, comma-separated. */
export const referralFilterSchema = z.object({
	state: text(200)
		.optional()
		.transform((s) =>
			s
				? s
						.split(',')
						.map((p) => p.trim())
						.filter(Boolean)
				: []
		)
		.pipe(
			z.array(
				z.enum(REFERRAL_STATES, { error: `must be states from ${REFERRAL_STATES.join(', ')}` })
			)
		),
	sort: z.enum(REFERRAL_SORTS, { error: 'must be date or urgency' }).default('date'),
	q: text(100)
		.transform((s) => s.trim())
		.optional()
});
export type ReferralFilter = z.infer<typeof referralFilterSchema>;
