import type { z } from 'zod';
import { formValues, parseForm, textOf, type FormResult } from '$lib/forms';
import { giveConsentSchema, openReferralSchema, transitionSchema } from './schemas';
import { CONSENT_WORDS, REFERRAL_WORDS, TRANSITION_WORDS } from './words';

export { CONSENT_WORDS, REFERRAL_WORDS, TRANSITION_WORDS };

// The referral and consent forms post flat fields; these shape them like the API's JSON so one
// schema checks both, and say what to fix in words for people. Pure and browser-safe: the pages
// run them before submitting, for instant inline errors.

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
