import type { LibraryEntry } from './entry';
import { STABILISATION_BASE } from './library/stabilisation';
import { TRUNK_LOADS } from './library/loads-trunk';
import { OTHER_LOADS } from './library/loads-other';

export * from './entry';

/**
 * The exercise library Seamwell ships. The category tags decide what the plan check allows, so
 * this table is written to be read and reviewed section by section (./library/, in this
 * order) — by a pelvic-health physiotherapist, ideally. Every entry carries one line (`why`)
 * saying why each tag applies.
 *
 * Tagging rules kept throughout:
 * - `deep_stability` only for the stabilisation base: breath with deep-core engagement and
 *   movements done with a steady trunk and a supported spine. Four-point kneeling with the
 *   knees down is `deep_stability`; knees hovering, or hands and toes, is `front_loaded`.
 * - Every other tag names a load that needs a clearance while a gap heals.
 * - No description teaches holding the breath under load: effort is on the exhale.
 * - Alternatives are listed safest-first and never add a load the exercise does not have.
 *
 * Slugs are stable public ids: never rename one; retire an entry by adding a new one.
 */
export const EXERCISE_LIBRARY: readonly LibraryEntry[] = [
	...STABILISATION_BASE,
	...TRUNK_LOADS,
	...OTHER_LOADS
];
