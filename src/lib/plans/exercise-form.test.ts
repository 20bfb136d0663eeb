import { describe, expect, it } from 'vitest';
import { exerciseFromForm } from './exercise-form';

// The studio's own exercise form: every missing field named at once, in words for people;
// a complete form becomes the API's shape. Invented exercise (common practice, no source).

describe('the studio exercise form', () => {
	it('an empty form names every required field at once', () => {
		const result = exerciseFromForm({ categories: [], alternativeIds: [] });
		expect(result.ok).toBe(false);
		if (result.ok) return;
		expect(Object.keys(result.errors).sort()).toEqual(
			['categories', 'description', 'difficulty', 'name', 'position'].sort()
		);
		expect(result.errors.categories).toMatch(/Tick at least one movement category|at least one/);
	});

	it('a complete form parses, alternatives capped at three', () => {
		const result = exerciseFromForm({
			name: 'Wall-supported squat with breath',
			description: 'Back to the wall, lower on the inhale, rise on the exhale.',
			position: 'standing',
			difficulty: '1',
			categories: ['deep_stability'],
			alternativeIds: [],
			why: 'Body weight only, supported.'
		});
		expect(result.ok).toBe(true);
		if (!result.ok) return;
		expect(result.data).toMatchObject({
			position: 'standing',
			difficulty: 1,
			categories: ['deep_stability']
		});
	});
});
