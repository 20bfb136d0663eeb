import type { FormWords } from '$lib/forms';

// The referral, consent and transition forms' labels and messages, without zod (see ./form.ts).

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
