import { describe, expect, it } from 'vitest';
import { pointerToPath } from '$lib/forms';
import { clientEditFromForm, clientFromForm, screeningField, screeningFromForm } from './form';

function form(entries: Array<[string, string]>): FormData {
	const data = new FormData();
	for (const [key, value] of entries) data.append(key, value);
	return data;
}

const site = (name: string, width: string): Array<[string, string]> => [
	[`${name}.widthFingers`, width],
	[`${name}.depth`, 'shallow'],
	[`${name}.tension`, 'firm'],
	[`${name}.doming`, 'no']
];

describe('screeningFromForm', () => {
	it('turns flat fields into the API shape', () => {
		const result = screeningFromForm(
			form([
				['takenAt', '2025-01-15'],
				...site('above_navel', '1'),
				...site('at_navel', '2.5'),
				...site('below_navel', '0'),
				['at_navel.widthMm', '31'],
				['redFlags', 'leakage'],
				['redFlags', 'back_pain']
			])
		);
		expect(result.ok).toBe(true);
		if (!result.ok) return;
		expect(result.data.sites.at_navel).toEqual({
			widthFingers: 2.5,
			widthMm: 31,
			depth: 'shallow',
			tension: 'firm',
			doming: false
		});
		expect(result.data.redFlags).toEqual(['leakage', 'back_pain']);
	});

	it('names each bad field by its form name and keeps what was typed', () => {
		const result = screeningFromForm(
			form([
				['takenAt', '2025-01-15'],
				...site('above_navel', ''),
				...site('at_navel', '7'),
				...site('below_navel', '1'),
				['below_navel.widthMm', 'wide']
			])
		);
		expect(result.ok).toBe(false);
		if (result.ok) return;
		expect(Object.keys(result.errors).sort()).toEqual(
			['above_navel.widthFingers', 'at_navel.widthFingers', 'below_navel.widthMm'].sort()
		);
		// In words for people, not the API's: the field's plain request, or its label and rule.
		expect(result.errors['above_navel.widthFingers']).toBe('Choose the gap width above the navel');
		expect(result.errors['at_navel.widthFingers']).toBe(
			'At the navel: width must be 0 to 6 finger widths in half steps.'
		);
		expect(result.errors['below_navel.widthMm']).toBe(
			'Enter the width below the navel in millimetres, or leave it empty'
		);
		expect(result.values['at_navel.widthFingers']).toBe('7');
	});
});

describe('clientFromForm', () => {
	it('reads consent fields into intakeConsent and names their errors by field', () => {
		const result = clientFromForm(
			form([
				['name', 'Ada'],
				['stage', 'pregnant'],
				['dueDate', new Date(Date.now() + 60 * 86_400_000).toISOString().slice(0, 10)],
				['consentMethod', 'online'],
				['consentAt', 'yesterday']
			])
		);
		expect(result.ok).toBe(false);
		if (result.ok) return;
		expect(Object.keys(result.errors)).toEqual(['consentAt']);
	});
});

describe('an empty form reports every field at once, in plain words', () => {
	it('new client, no stage chosen: her name and the stage', () => {
		const result = clientFromForm(
			form([
				['name', ''],
				['consentMethod', '']
			])
		);
		expect(result.ok).toBe(false);
		if (result.ok) return;
		expect(result.errors).toEqual({
			name: 'Enter her name',
			stage: 'Choose whether she is pregnant or postpartum'
		});
	});

	it('new client, postpartum: every missing field of the stage on the first submit', () => {
		const result = clientFromForm(
			form([
				['name', ''],
				['birthYear', 'nineteen'],
				['stage', 'postpartum'],
				['birthDate', ''],
				['delivery', ''],
				['births', '']
			])
		);
		expect(result.ok).toBe(false);
		if (result.ok) return;
		expect(result.errors).toEqual({
			name: 'Enter her name',
			birthYear: 'Enter the year she was born, like 1990, or leave it empty',
			birthDate: 'Enter the date the baby was born',
			delivery: 'Choose how the baby was born',
			births: 'Enter how many births she has had, as a number'
		});
	});

	it('a rule broken is said with the field’s label', () => {
		const tomorrowPlusTwo = new Date(Date.now() + 3 * 86_400_000).toISOString().slice(0, 10);
		const result = clientEditFromForm(
			form([
				['name', 'Ada'],
				['stage', 'postpartum'],
				['birthDate', tomorrowPlusTwo],
				['delivery', 'vaginal'],
				['births', '1']
			])
		);
		expect(result.ok).toBe(false);
		if (result.ok) return;
		expect(result.errors).toEqual({ birthDate: 'Birth date must not be in the future.' });
	});
});

describe('problem pointers as form fields', () => {
	it('maps problem pointers to form names', () => {
		expect(screeningField(pointerToPath('/sites/at_navel/depth'))).toBe('at_navel.depth');
		expect(screeningField(pointerToPath('/takenAt'))).toBe('takenAt');
	});
});
