import type { MovementCategory } from '$lib/domain/movement';

// What the assessment form's page needs before anything is sent, without zod (./form.ts holds
// the checks, loaded when a form is sent).

/** Rows the assessment form offers (without JavaScript, every row is always there). */
export const POINT_ROWS = 4;

/** Hernia suspected or found: these wait unless she confirms clearing them. */
export const HERNIA_HOLDS: readonly MovementCategory[] = [
	'high_pressure',
	'loaded_flexion',
	'long_lever',
	'impact'
];
