import type { z } from 'zod';
import {
	formValues,
	issuesToFormErrors,
	type FormResult,
	type FormValues
} from '$lib/clients/form';
import { giveConsentSchema, openReferralSchema, transitionSchema } from './schemas';

// Forms post flat fields; these shape them like the API's JSON so one schema checks both.
// Pure and browser-safe: the pages run them before submitting, for instant inline errors.

export type { FormResult, FormValues };

const str = (values: FormValues, key: string): string => {
	const value = values[key];
	return typeof value === 'string' ? value.trim() : '';
};

const list = (form: FormData, key: string): string[] =>
	form.getAll(key).filter((v): v is string => typeof v === 'string');

function result<T extends z.ZodType>(
	schema: T,
	body: unknown,
	values: FormValues
): FormResult<z.infer<T>> {
	const parsed = schema.safeParse(body);
	if (!parsed.success) {
		return {
			ok: false,
			values,
			errors: issuesToFormErrors(parsed.error.issues, (p) => p.split('.')[0]!)
		};
	}
	return { ok: true, data: parsed.data, values };
}

export function referralFromForm(form: FormData): FormResult<z.infer<typeof openReferralSchema>> {
	const values = { ...formValues(form), redFlags: list(form, 'redFlags') };
	return result(
		openReferralSchema,
		{
			clientId: str(values, 'clientId'),
			clinicId: str(values, 'clinicId'),
			physioId: str(values, 'physioId') || null,
			reason: str(values, 'reason'),
			urgency: str(values, 'urgency') || undefined,
			redFlags: values.redFlags,
			duplicateReason: str(values, 'duplicateReason')
		},
		values
	);
}

export function consentFromForm(form: FormData): FormResult<z.infer<typeof giveConsentSchema>> {
	const values = { ...formValues(form), scopes: list(form, 'scopes') };
	return result(
		giveConsentSchema,
		{
			clinicId: str(values, 'clinicId'),
			scopes: values.scopes,
			endsAt: str(values, 'endsAt') || null
		},
		values
	);
}

export function transitionFromForm(form: FormData): FormResult<z.infer<typeof transitionSchema>> {
	const values = formValues(form);
	return result(transitionSchema, { to: str(values, 'to'), reason: str(values, 'reason') }, values);
}
