import { describe, expect, it } from 'vitest';
import { clientFromForm, pointerToField, screeningFromForm } from './form';

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
		expect(result.errors['above_navel.widthFingers']).toBe('required');
		expect(result.errors['below_navel.widthMm']).toBe('must be a number of millimetres');
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

describe('pointerToField', () => {
	it('maps problem pointers to form names', () => {
		expect(pointerToField('/sites/at_navel/depth')).toBe('at_navel.depth');
		expect(pointerToField('/takenAt')).toBe('takenAt');
	});
});
