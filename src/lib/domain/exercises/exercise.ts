import type { MovementCategory } from '../movement';
import {
	EXERCISE_LIBRARY,
	STOP_SIGNS_TEXT,
	type Difficulty,
	type LibraryEntry,
	type Position
} from './library';

/**
 * One exercise as the plan check, the API and the screens see it. A shipped exercise's id is
 * its slug (a stable public id); a studio's own exercise has a UUID and is `custom`.
 */
export interface Exercise {
	id: string;
	slug: string;
	name: string;
	description: string;
	position: Position;
	difficulty: Difficulty;
	categories: MovementCategory[];
	alternativeIds: string[];
	custom: boolean;
	/** Why each tag applies (shipped exercises; a studio's own may leave it empty). */
	why: string;
	stopSigns: string;
}

export function describeEntry(entry: Pick<LibraryEntry, 'how' | 'feel' | 'cue'>): string {
	return `${entry.how} What to feel: ${entry.feel} Cue: ${entry.cue}`;
}

export function fromLibraryEntry(entry: LibraryEntry): Exercise {
	return {
		id: entry.slug,
		slug: entry.slug,
		name: entry.name,
		description: describeEntry(entry),
		position: entry.position,
		difficulty: entry.difficulty,
		categories: [...entry.categories],
		alternativeIds: [...entry.alternatives],
		custom: false,
		why: entry.why,
		stopSigns: STOP_SIGNS_TEXT
	};
}

/** The shipped library as exercises, in the data file's order. */
export const SHIPPED_EXERCISES: readonly Exercise[] = EXERCISE_LIBRARY.map(fromLibraryEntry);
