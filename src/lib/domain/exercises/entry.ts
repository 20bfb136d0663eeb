import type { MovementCategory } from '../movement';

// The shape of one entry in the exercise library (./library.ts), and the words around it.

export const POSITIONS = [
	'supine',
	'side_lying',
	'prone',
	'four_point',
	'seated',
	'standing'
] as const;
export type Position = (typeof POSITIONS)[number];

export const POSITION_LABELS: Record<Position, string> = {
	supine: 'Lying on the back',
	side_lying: 'Lying on the side',
	prone: 'Lying face down',
	four_point: 'On hands and knees (or hands and toes)',
	seated: 'Sitting',
	standing: 'Standing'
};

export type Difficulty = 1 | 2 | 3;

export interface LibraryEntry {
	slug: string;
	name: string;
	position: Position;
	difficulty: Difficulty;
	categories: MovementCategory[];
	/** One line: why each tag applies (and why none other does, where that is not obvious). */
	why: string;
	/** How to do it. */
	how: string;
	/** What she should feel. */
	feel: string;
	/** One cue. */
	cue: string;
	/** 1–3 safer slugs, best first. */
	alternatives: string[];
}

/** Shown on every card, whatever the exercise. */
export const STOP_SIGNS = [
	'pain',
	'leaking',
	'heaviness or dragging in the pelvis',
	'doming or bulging along the midline',
	'bleeding'
] as const;

export const STOP_SIGNS_TEXT = `Stop and tell your instructor if you feel ${STOP_SIGNS.slice(0, -1).join(', ')} or ${STOP_SIGNS[STOP_SIGNS.length - 1]}.`;
