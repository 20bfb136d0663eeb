import { describe, expect, it } from 'vitest';
import { MOVEMENT_CATEGORIES } from '../movement';
import { SHIPPED_EXERCISES } from './exercise';
import { EXERCISE_LIBRARY, POSITIONS, STOP_SIGNS_TEXT } from './library';

const bySlug = new Map(EXERCISE_LIBRARY.map((e) => [e.slug, e]));

describe('shipped exercise library — integrity', () => {
	it('has at least 40 exercises with unique, kebab-case slugs and names', () => {
		expect(EXERCISE_LIBRARY.length).toBeGreaterThanOrEqual(40);
		expect(bySlug.size).toBe(EXERCISE_LIBRARY.length);
		expect(new Set(EXERCISE_LIBRARY.map((e) => e.name.toLowerCase())).size).toBe(
			EXERCISE_LIBRARY.length
		);
		for (const e of EXERCISE_LIBRARY) expect(e.slug).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
	});

	it('uses only known category codes and positions, difficulty 1–3, at least one category', () => {
		for (const e of EXERCISE_LIBRARY) {
			expect(e.categories.length, e.slug).toBeGreaterThan(0);
			expect(new Set(e.categories).size, e.slug).toBe(e.categories.length);
			for (const c of e.categories) expect(MOVEMENT_CATEGORIES, e.slug).toContain(c);
			expect(POSITIONS, e.slug).toContain(e.position);
			expect([1, 2, 3], e.slug).toContain(e.difficulty);
		}
	});

	it('keeps deep_stability for the stabilisation base only (never beside a load tag)', () => {
		for (const e of EXERCISE_LIBRARY) {
			if (e.categories.includes('deep_stability'))
				expect(e.categories, e.slug).toEqual(['deep_stability']);
		}
		// four-point kneeling with the knees down is the base; knees hovering is front-loaded
		expect(bySlug.get('four-point-breath')?.categories).toEqual(['deep_stability']);
		expect(bySlug.get('four-point-knee-hover')?.categories).toContain('front_loaded');
		expect(bySlug.get('high-plank')?.categories).toContain('front_loaded');
	});

	it('lists 1–3 alternatives that exist, are not the exercise itself, and add no load', () => {
		for (const e of EXERCISE_LIBRARY) {
			expect(e.alternatives.length, e.slug).toBeGreaterThanOrEqual(1);
			expect(e.alternatives.length, e.slug).toBeLessThanOrEqual(3);
			expect(new Set(e.alternatives).size, e.slug).toBe(e.alternatives.length);
			for (const alt of e.alternatives) {
				expect(alt, e.slug).not.toBe(e.slug);
				const target = bySlug.get(alt);
				expect(target, `${e.slug} → ${alt}`).toBeDefined();
				const added = target!.categories.filter(
					(c) => c !== 'deep_stability' && !e.categories.includes(c)
				);
				expect(added, `${e.slug} → ${alt}`).toEqual([]);
			}
		}
	});

	it('has a description (how, what to feel, a cue) and a note for each tag on every card', () => {
		for (const e of EXERCISE_LIBRARY) {
			for (const field of [e.name, e.how, e.feel, e.cue, e.why])
				expect(field.trim().length, e.slug).toBeGreaterThan(5);
			for (const c of e.categories) expect(e.why, e.slug).toContain(`${c}:`);
		}
		for (const x of SHIPPED_EXERCISES) {
			expect(x.description).toContain('What to feel:');
			expect(x.description).toContain('Cue:');
			expect(x.stopSigns).toBe(STOP_SIGNS_TEXT);
			expect(x.stopSigns).toMatch(/pain.*leaking.*heaviness.*doming.*bleeding/);
		}
	});

	it('never teaches holding the breath: every description breathes out, none says hold the breath', () => {
		for (const e of EXERCISE_LIBRARY) {
			const text = `${e.how} ${e.feel} ${e.cue}`.toLowerCase();
			expect(text, e.slug).not.toMatch(
				/hold (your|the) breath|holding (your|the) breath|brace and hold/
			);
		}
		// every loaded exercise names the out-breath in its instructions
		for (const e of EXERCISE_LIBRARY.filter((x) => !x.categories.includes('deep_stability'))) {
			expect(`${e.how} ${e.cue}`.toLowerCase(), e.slug).toMatch(
				/breath(e|ing)? (out|steadily)|breathe out|exhale|breath out|breathing steadily|steady breath/
			);
		}
	});

	it('covers the stabilisation work and every load that needs clearance', () => {
		for (const c of MOVEMENT_CATEGORIES) {
			expect(
				EXERCISE_LIBRARY.filter((e) => e.categories.includes(c)).length,
				c
			).toBeGreaterThanOrEqual(2);
		}
	});
});
