import type { z } from 'zod';
import { formValues, parseForm, textOf, type FormResult, type FormWords } from '$lib/forms';
import { giveConsentSchema, openReferralSchema, transitionSchema } from './schemas';

// The referral and consent forms post flat fields; these shape them like the API's JSON so one
// schema checks both, and say what to fix in words for people. Pure and browser-safe: the pages
// run them before submitting, for instant inline errors.

export const REFERRAL_WORDS: FormWords = {
	clientId: { label: 'Client', missing: 'Choose the client to refer' },
	clinicId: { label: 'Clinic', missing: 'Choose the clinic to refer her to' },
	physioId: { label: 'Physiotherapist', missing: 'Choose a physiotherapist, or leave it open' },
	reason: { label: 'Reason', missing: 'Write why you are referring her' },
	urgency: { label: 'Urgency', missing: 'Choose how soon she should be seen' },
	redFlags: { label: 'Red flags', missing: 'Choose red flags from the list' },
	duplicateReason: { label: 'Open referral', missing: 'Say why she needs a second referral' }
};

export const CONSENT_WORDS: FormWords = {
	clinicId: { label: 'Clinic', missing: 'Choose the clinic to share with' },
	scopes: { label: 'What to share', missing: 'Choose at least one thing to share' },
	endsAt: { label: 'End date', missing: 'Enter the day sharing should end, or leave it empty' }
};

export const TRANSITION_WORDS: FormWords = {
	to: { label: 'Next step', missing: 'Choose what happens to the referral' },
	reason: { label: 'Reason' }
};

/** Issue paths name the field itself, never an item in a list (`scopes.0` → `scopes`). */
const topField = (path: string) => path.split('.')[0]!;

export function referralFromForm(form: FormData): FormResult<z.infer<typeof openReferralSchema>> {
	const values = formValues(form, ['redFlags']);
	const body = {
		clientId: textOf(values, 'clientId'),
		clinicId: textOf(values, 'clinicId'),
		physioId: textOf(values, 'physioId') || null,
		reason: textOf(values, 'reason'),
		urgency: textOf(values, 'urgency') || undefined,
		redFlags: values.redFlags,
		duplicateReason: textOf(values, 'duplicateReason')
	};
	return parseForm(openReferralSchema, body, values, { rename: topField, words: REFERRAL_WORDS });
}

export function consentFromForm(form: FormData): FormResult<z.infer<typeof giveConsentSchema>> {
	const values = formValues(form, ['scopes']);
	const body = {
		clinicId: textOf(values, 'clinicId'),
		scopes: values.scopes,
		endsAt: textOf(values, 'endsAt') || null
	};
	return parseForm(giveConsentSchema, body, values, { rename: topField, words: CONSENT_WORDS });
}

export function transitionFromForm(form: FormData): FormResult<z.infer<typeof transitionSchema>> {
	const values = formValues(form);
	const body = { to: textOf(values, 'to'), reason: textOf(values, 'reason') };
	return parseForm(transitionSchema, body, values, { rename: topField, words: TRANSITION_WORDS });
}
