import { describe, expect, it } from 'vitest';
import { reviewWindow } from './schemas';
import { assessmentFromForm, clearanceFromForm } from './form';

// The flat assessment and clearance forms, shaped like the API's JSON (issue 13, part 3).

const form = (fields: Record<string, string>) => {
	const data = new FormData();
	for (const [k, v] of Object.entries(fields)) data.append(k, v);
	return data;
};
const levels = (level: string, overrides: Record<string, string> = {}) =>
	Object.fromEntries(
		[
			'loaded_flexion',
			'long_lever',
			'front_loaded',
			'loaded_rotation',
			'loaded_extension',
			'inversion',
			'high_pressure',
			'impact',
			'deep_stability'
		].map((c) => [`level.${c}`, overrides[c] ?? level])
	);

describe('assessmentFromForm', () => {
	it('keeps only rows with a width; preset distances alone do not make a row', () => {
		const parsed = assessmentFromForm(
			form({
				'p0.position': 'above',
				'p0.distanceCm': '3',
				'p0.restMm': '24',
				'p0.method': 'ultrasound',
				'p2.position': 'below',
				'p2.distanceCm': '3',
				'p2.method': 'ultrasound',
				hernia: 'none',
				plan: 'Retrain'
			})
		);
		expect(parsed.ok).toBe(true);
		if (parsed.ok) expect(parsed.data.points).toHaveLength(1);
	});
	it('names the row a bad width belongs to', () => {
		const parsed = assessmentFromForm(
			form({
				'p1.position': 'at',
				'p1.restMm': '151',
				'p1.method': 'caliper',
				hernia: 'none',
				plan: 'x'
			})
		);
		expect(parsed.ok).toBe(false);
		if (!parsed.ok) expect(parsed.errors['p1.restMm']).toContain('0–150');
	});
});

describe('clearanceFromForm', () => {
	const reviewOn = reviewWindow().first;
	it('drops a text left under a category switched away from modify', () => {
		const parsed = clearanceFromForm(
			form({ ...levels('cleared'), 'mod.impact': 'left over', reviewOn }),
			null
		);
		expect(parsed.ok).toBe(true);
		if (parsed.ok) expect(parsed.data.modifications).toEqual({});
	});
	it('asks for every category and for the text of each modify', () => {
		const parsed = clearanceFromForm(
			form({ ...levels('cleared', { front_loaded: 'modify' }), 'level.impact': '', reviewOn }),
			null
		);
		expect(parsed.ok).toBe(false);
		if (!parsed.ok) {
			expect(parsed.errors['mod.front_loaded']).toContain('write the modification');
		}
	});
	it('with a hernia suspected, clearing a pre-held category needs her confirmation', () => {
		const fields = { ...levels('hold', { impact: 'cleared', inversion: 'cleared' }), reviewOn };
		const refused = clearanceFromForm(form(fields), 'suspected');
		expect(refused.ok).toBe(false);
		if (!refused.ok) {
			expect(Object.keys(refused.errors).sort()).toEqual(['confirmHernia', 'level.impact']);
		}
		expect(clearanceFromForm(form({ ...fields, confirmHernia: 'yes' }), 'suspected').ok).toBe(true);
		expect(clearanceFromForm(form(fields), 'none').ok).toBe(true);
	});
});
