import { describe, expect, it } from 'vitest';
import type { FormValues } from '../forms';
import { selfCheckFromForm } from './check-form';

// The one-page self-check (no JavaScript) follows the step-by-step page's rules. Which
// symptoms are urgent is SYMPTOM_URGENCY's (sourced in domain/self-check.ts); these tests check
// only how the form is read.

const AT = new Date('2026-11-20T09:00:00Z');
const WIDTHS: FormValues = {
	form: 'self-check',
	'width-above_navel': '1.5',
	'width-at_navel': '2',
	'width-below_navel': '0.5',
	'doming-at_navel': 'on'
};

describe('selfCheckFromForm', () => {
	it('reads all three places, with deep and doming as ticked', () => {
		const result = selfCheckFromForm({ ...WIDTHS, symptoms: [] }, AT);
		expect(result.ok && result.data.sites).toEqual({
			above_navel: { widthFingers: 1.5, deep: false, doming: false },
			at_navel: { widthFingers: 2, deep: false, doming: true },
			below_navel: { widthFingers: 0.5, deep: false, doming: false }
		});
	});

	it('records no finger widths when all three are left "Not checked"', () => {
		const result = selfCheckFromForm(
			{ form: 'self-check', symptoms: ['back_pain'], 'width-above_navel': '' },
			AT
		);
		expect(result.ok && result.data).toMatchObject({ sites: null, symptoms: ['back_pain'] });
	});

	it('asks for all three places or none, in words', () => {
		const result = selfCheckFromForm({ form: 'self-check', 'width-at_navel': '2' }, AT);
		expect(result.ok).toBe(false);
		expect(!result.ok && result.errors.sites).toMatch(/all three places/);
	});

	it('leaves the finger widths out after an urgent symptom (the advice comes first)', () => {
		const result = selfCheckFromForm({ ...WIDTHS, symptoms: ['headache'] }, AT);
		expect(result.ok && result.data).toMatchObject({ sites: null, symptoms: ['headache'] });
		const notUrgent = selfCheckFromForm({ ...WIDTHS, symptoms: ['back_pain'] }, AT);
		expect(notUrgent.ok && notUrgent.data.sites).not.toBeNull();
	});

	it('leaves them out when her caesarean wound has not healed, keeps them when it has', () => {
		const notHealed = selfCheckFromForm({ ...WIDTHS, woundHealed: 'no' }, AT);
		expect(notHealed.ok && notHealed.data).toMatchObject({ sites: null, woundHealed: false });
		const healed = selfCheckFromForm({ ...WIDTHS, woundHealed: 'yes' }, AT);
		expect(healed.ok && healed.data.woundHealed).toBe(true);
		expect(healed.ok && healed.data.sites).not.toBeNull();
	});

	it('answers a tampered form in words, every field at once', () => {
		const result = selfCheckFromForm(
			{
				form: 'self-check',
				symptoms: ['not_a_symptom'],
				woundHealed: 'maybe',
				'width-above_navel': 'seven',
				'width-at_navel': '2',
				'width-below_navel': '2'
			},
			AT
		);
		expect(result.ok).toBe(false);
		if (result.ok) return;
		expect(result.errors.symptoms).toMatch(/Tick what you noticed/);
		expect(result.errors.woundHealed).toMatch(/Say whether your caesarean wound has healed/);
		expect(result.errors.sites).toMatch(/^Finger widths /);
	});
});
