import type { EffectiveLevel, MovementCategory } from '$lib/domain/movement';
import { readableDays } from './words';

// The clearance card's words for the client herself (her record page), apart from the
// studio's words in ./words.ts so that the studio's pages do not load them.

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

/** What ClearanceCard says to her instead of the studio's words (its `plain` prop). */
export const CLIENT_WORDS = {
	categories: CLIENT_CATEGORY_WORDS,
	levels: CLIENT_LEVEL_WORDS,
	reason: reasonForClient
};
export type ClientWords = typeof CLIENT_WORDS;
