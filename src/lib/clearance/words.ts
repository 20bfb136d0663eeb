import type { EffectiveLevel, MovementCategory } from '$lib/domain/movement';
import { formatDate } from '$lib/dates';
import type { ClearanceView } from './types';

// The words each screen uses for clearances: the instructor's, and the client's plain ones.
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

/** The client's words for each kind of movement. */
export const CLIENT_CATEGORY_WORDS: Record<MovementCategory, string> = {
	loaded_flexion: 'Curling up against resistance (crunches, roll-ups)',
	long_lever: 'Holding your legs or arms out long while your tummy works',
	front_loaded: 'Planks, and work on hands and knees',
	loaded_rotation: 'Twisting against resistance',
	loaded_extension: 'Arching back with a stretch across your tummy',
	inversion: 'Going upside down and rolling',
	high_pressure: 'Heavy lifting and holding your breath to push',
	impact: 'Jumping, running and other impact',
	deep_stability: 'Breathing and gentle deep-tummy exercises'
};

/** The client's words for a level. */
export const CLIENT_LEVEL_WORDS: Record<EffectiveLevel, string> = {
	cleared: 'You can do this',
	modify: 'You can do this, changed like this',
	hold: 'Not yet — wait for now',
	no_limit: 'Nothing noted'
};

/** Calendar days written out ("18 Nov 2026") wherever a reason names one as 2026-11-18. */
export function readableDays(text: string): string {
	return text.replace(/\b(\d{4}-\d{2}-\d{2})\b/g, (iso) => formatDate(iso));
}

// The reasons are written for the studio ("until she has been assessed"); the client reads
// the same reason addressed to her. Longest phrases first, so "that she was seen" is not
// half-rewritten by "she".
const TO_CLIENT: Array<[RegExp, string]> = [
	[/\bthat she was seen\b/g, 'that you were seen'],
	[/\bwhether she is\b/g, 'whether you are'],
	[/\buntil she has been\b/g, 'until you have been'],
	[/\b(cleared|assessed|seen|clears) her\b/g, '$1 you'],
	[/\bHer\b/g, 'Your'],
	[/\bher\b/g, 'your']
];

/** A reason from the movement limits, said to the client herself, with its days written out. */
export function reasonForClient(reason: string): string {
	return TO_CLIENT.reduce(
		(text, [pattern, words]) => text.replace(pattern, words),
		readableDays(reason)
	);
}
