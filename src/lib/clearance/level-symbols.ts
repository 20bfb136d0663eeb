import type { EffectiveLevel } from '$lib/domain/movement';

/** A symbol beside each level, so the level never rests on colour. */
export const LEVEL_SYMBOLS: Record<EffectiveLevel, string> = {
	cleared: '✓',
	modify: '≈',
	hold: '✕',
	no_limit: '–'
};
