import type { EffectiveLevel } from '$lib/domain/movement';
import { formatDate } from '$lib/dates';
import type { ClearanceView } from './types';

// The words each screen uses for clearances (the client's own, plainer ones are in
// ./client-words.ts).
// Every level is said in words (and a symbol), never by colour alone.

export type ClearanceStatus =
	| 'see_doctor'
	| 'review_overdue'
	| 'new_findings'
	| 'cleared_with_changes'
	| 'cleared'
	| 'provisional';

export const STATUS_LABELS: Record<ClearanceStatus, string> = {
	see_doctor: 'See doctor first',
	review_overdue: 'Review overdue',
	new_findings: 'New findings since the clearance',
	cleared_with_changes: 'Cleared with changes',
	cleared: 'Cleared',
	provisional: 'Provisional'
};

/** The one status a list badge shows: the most urgent first. */
export function clearanceStatus(
	view: Pick<ClearanceView, 'seeDoctorFirst' | 'provisional' | 'reviewOverdue' | 'newFindings'> & {
		effective: Record<string, { level: EffectiveLevel }>;
	}
): ClearanceStatus {
	if (view.seeDoctorFirst) return 'see_doctor';
	if (view.provisional) return 'provisional';
	if (view.reviewOverdue) return 'review_overdue';
	if (view.newFindings.length > 0) return 'new_findings';
	const levels = Object.values(view.effective).map((l) => l.level);
	return levels.every((l) => l === 'cleared') ? 'cleared' : 'cleared_with_changes';
}

/** The instructor's words for a level. */
export const LEVEL_WORDS: Record<EffectiveLevel, string> = {
	cleared: 'Cleared',
	modify: 'Cleared with a change',
	hold: 'Not yet',
	no_limit: 'No limit noted'
};

// In a module of its own so the clearance form loads the symbols without these words.
export { LEVEL_SYMBOLS } from './level-symbols';

/** Calendar days written out ("18 Nov 2026") wherever a reason names one as 2026-11-18. */
export function readableDays(text: string): string {
	return text.replace(/\b(\d{4}-\d{2}-\d{2})\b/g, (iso) => formatDate(iso));
}
