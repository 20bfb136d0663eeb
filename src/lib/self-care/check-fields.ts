import { ADVICE_RANK, SYMPTOM_URGENCY } from '../domain/self-check';
import type { RedFlag } from '../domain/red-flags';
import type { Site } from '../domain/sites';

// What the self-check page needs in the browser, apart from the form's parser
// (check-form.ts, which brings the schemas and runs on the server): kept small so the page
// does not load zod.

/** The form's field names for one place. */
export const siteField = (site: Site, part: 'width' | 'deep' | 'doming') => `${part}-${site}`;

/** A symptom that needs help today or sooner: the advice comes without any self-examination. */
export function isUrgent(symptoms: readonly RedFlag[]): boolean {
	return symptoms.some((s) => ADVICE_RANK[SYMPTOM_URGENCY[s]] <= ADVICE_RANK.same_day);
}
