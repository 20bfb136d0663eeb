import { SITES, SITE_LABELS, siteLabelCapitalised } from '$lib/domain/sites';
import type { FormWords } from '$lib/forms';

// The client and screening forms' labels and plain-words messages, without zod: the pages show
// them at once and load the form checks (./form.ts) only when a form is sent.

export const CLIENT_WORDS: FormWords = {
	name: { label: 'Name', missing: 'Enter her name' },
	email: {
		label: 'E-mail',
		missing: 'Enter an e-mail address like name@example.com, or leave it empty'
	},
	birthYear: {
		label: 'Year of birth',
		missing: 'Enter the year she was born, like 1990, or leave it empty'
	},
	stage: { label: 'Stage', missing: 'Choose whether she is pregnant or postpartum' },
	dueDate: { label: 'Due date', missing: 'Enter her due date' },
	birthDate: { label: 'Birth date', missing: 'Enter the date the baby was born' },
	delivery: { label: 'Delivery', missing: 'Choose how the baby was born' },
	births: { label: 'Births so far', missing: 'Enter how many births she has had, as a number' },
	multiples: { label: 'Twins or more', missing: 'Tick the box only for twins or more' },
	postnatalCheckOn: {
		label: 'Postnatal check date',
		missing: 'Enter the day of her postnatal check, or leave it empty'
	},
	postnatalCleared: { label: 'Cleared at the check', missing: 'Choose yes, no or not known yet' },
	notes: { label: 'Notes' },
	consentMethod: { label: 'How she agreed', missing: 'Choose how she agreed' },
	consentAt: { label: 'Consent date', missing: 'Enter the day she agreed' }
};

export const SCREENING_WORDS: FormWords = {
	takenAt: { label: 'Date', missing: 'Enter the day of the screening' },
	redFlags: { label: 'Red flags', missing: 'Choose red flags from the list' },
	notes: { label: 'Notes' },
	...Object.fromEntries(
		SITES.flatMap((site) => {
			const where = SITE_LABELS[site];
			const label = siteLabelCapitalised(site);
			return [
				[
					`${site}.widthFingers`,
					{ label: `${label}: width`, missing: `Choose the gap width ${where}` }
				],
				[
					`${site}.widthMm`,
					{
						label: `${label}: width in mm`,
						missing: `Enter the width ${where} in millimetres, or leave it empty`
					}
				],
				[
					`${site}.depth`,
					{ label: `${label}: depth`, missing: `Choose how deep the fingers sink ${where}` }
				],
				[
					`${site}.tension`,
					{
						label: `${label}: tension`,
						missing: `Choose whether the midline feels firm or soft ${where}`
					}
				],
				[
					`${site}.doming`,
					{ label: `${label}: doming`, missing: `Say whether you saw doming ${where}` }
				]
			];
		})
	)
};
