import { describe, expect, it } from 'vitest';
import { assessmentSchema, clearanceSchema, reviewWindow } from './schemas';

// Bad input for assessments and clearances (issue 13): each refused with a pointer-ready path.

const levels = {
	loaded_flexion: 'hold',
	long_lever: 'cleared',
	front_loaded: 'modify',
	loaded_rotation: 'cleared',
	loaded_extension: 'cleared',
	inversion: 'cleared',
	high_pressure: 'cleared',
	impact: 'cleared',
	deep_stability: 'cleared'
};
const { first, last } = reviewWindow();
const good = {
	categories: levels,
	modifications: { front_loaded: 'Forearm plank on a bench, 3 breaths' },
	notes: null,
	reviewOn: first
};
const paths = (input: unknown) =>
	clearanceSchema.safeParse(input).error?.issues.map((i) => i.path.join('.')) ?? [];

describe('clearanceSchema', () => {
	it('accepts nine levels, a text for each modify, a review from tomorrow to 26 weeks', () => {
		expect(clearanceSchema.safeParse(good).success).toBe(true);
		expect(clearanceSchema.safeParse({ ...good, reviewOn: last }).success).toBe(true);
	});
	it('refuses a missing category, an unknown category or level', () => {
		const eight: Record<string, string> = { ...levels };
		delete eight.impact;
		expect(paths({ ...good, categories: eight })).toContain('categories.impact');
		expect(paths({ ...good, categories: { ...levels, jumping: 'hold' } })).toEqual(['categories']);
		expect(paths({ ...good, categories: { ...levels, impact: 'maybe' } })).toContain(
			'categories.impact'
		);
	});
	it('refuses modify without its text and a text on a category not marked modify', () => {
		expect(paths({ ...good, modifications: {} })).toEqual(['modifications.front_loaded']);
		expect(
			paths({ ...good, modifications: { ...good.modifications, loaded_flexion: 'x' } })
		).toEqual(['modifications.loaded_flexion']);
		expect(paths({ ...good, modifications: { front_loaded: '   ' } })).toContain(
			'modifications.front_loaded'
		);
	});
	it('refuses a review date today, in the past or beyond 26 weeks', () => {
		const today = new Date().toISOString().slice(0, 10);
		const after = new Date(Date.parse(last) + 86_400_000).toISOString().slice(0, 10);
		for (const reviewOn of [today, '2020-01-01', after, 'soon']) {
			expect(paths({ ...good, reviewOn })).toEqual(['reviewOn']);
		}
	});
});

describe('assessmentSchema', () => {
	const point = { position: 'above', distanceCm: 3, restMm: 22, method: 'caliper' };
	const ok = { points: [point], hernia: 'none', plan: 'Deep-core retraining, review in 6 weeks' };
	const issues = (points: unknown[]) =>
		assessmentSchema.safeParse({ ...ok, points }).error?.issues.map((i) => i.path.join('.')) ?? [];
	it('accepts a point above the navel with a distance and one width', () => {
		expect(assessmentSchema.safeParse(ok).success).toBe(true);
		expect(issues([{ position: 'at', restMm: 0, method: 'ultrasound' }])).toEqual([]);
		expect(issues([{ position: 'xiphoid', curlUpMm: 150, method: 'palpation' }])).toEqual([]);
	});
	it('refuses mm outside 0–150, distance outside 0–15, at or xiphoid with a distance', () => {
		expect(issues([{ ...point, restMm: 151 }])).toEqual(['points.0.restMm']);
		expect(issues([{ ...point, curlUpMm: -1 }])).toEqual(['points.0.curlUpMm']);
		expect(issues([{ ...point, distanceCm: 15.5 }])).toEqual(['points.0.distanceCm']);
		expect(issues([{ ...point, position: 'at', distanceCm: 2 }])).toEqual(['points.0.distanceCm']);
		expect(issues([{ ...point, position: 'xiphoid', distanceCm: 0 }])).toEqual([
			'points.0.distanceCm'
		]);
		expect(issues([{ position: 'below', restMm: 10, method: 'caliper' }])).toEqual([
			'points.0.distanceCm'
		]);
	});
	it('refuses a point with no width, an unknown method, no points, an empty plan', () => {
		expect(issues([{ position: 'at', method: 'caliper' }])).toEqual(['points.0.restMm']);
		expect(issues([{ ...point, method: 'ruler' }])).toEqual(['points.0.method']);
		expect(issues([])).toEqual(['points']);
		expect(assessmentSchema.safeParse({ ...ok, plan: ' ' }).success).toBe(false);
	});
});
