import type { SelfCheckSite } from '../domain/self-check';
import { SITES, type Site } from '../domain/sites';
import {
	issuesToFormErrors,
	listOf,
	numberOf,
	textOf,
	yesNoOf,
	type FormResult,
	type FormValues
} from '../forms';
import { selfCheckInputSchema, type SelfCheckInputData } from './schemas';
import { isUrgent, siteField } from './check-fields';

// The self-check as one plain form (the page without JavaScript): her symptoms, her answer
// about a caesarean wound, and the three places, each left "Not checked" or given a width.
// The same rules as the step-by-step page: an urgent symptom is answered at once without the
// finger-width part, and so is a wound that has not healed (or that she is not sure of).

const WORDS = {
	symptoms: { label: 'Symptoms', missing: 'Tick what you noticed from the list, then save again.' },
	woundHealed: { label: 'Your wound', missing: 'Say whether your caesarean wound has healed.' },
	sites: { label: 'Finger widths' }
};

export function selfCheckFromForm(
	values: FormValues,
	takenAt: Date
): FormResult<SelfCheckInputData> {
	const symptoms = listOf(values, 'symptoms');
	const woundHealed = yesNoOf(values, 'woundHealed') ?? null;
	const widths = SITES.map((site) => numberOf(values, siteField(site, 'width')));
	const given = widths.filter((w) => w !== undefined).length;
	if (given > 0 && given < SITES.length) {
		return {
			ok: false,
			values,
			errors: {
				sites: 'Give a finger width at all three places, or leave all three as “Not checked”.'
			}
		};
	}
	const sites =
		given === SITES.length
			? (Object.fromEntries(
					SITES.map((site, i) => [
						site,
						{
							widthFingers: widths[i],
							deep: textOf(values, siteField(site, 'deep')) !== '',
							doming: textOf(values, siteField(site, 'doming')) !== ''
						}
					])
				) as Record<Site, SelfCheckSite>)
			: null;
	const parsed = selfCheckInputSchema.safeParse({
		takenAt: takenAt.toISOString(),
		symptoms,
		woundHealed,
		sites
	});
	if (!parsed.success) {
		return {
			ok: false,
			values,
			errors: issuesToFormErrors(parsed.error.issues, (p) => p.split('.')[0] ?? p, WORDS)
		};
	}
	const data = parsed.data;
	// The finger-width part waits for help first, or for a healed wound.
	if (isUrgent(data.symptoms) || data.woundHealed === false) data.sites = null;
	return { ok: true, values, data };
}
