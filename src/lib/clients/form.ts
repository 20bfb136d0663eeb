import type { z } from 'zod';
import { SITES } from '$lib/domain';
import {
	clientCreateSchema,
	intakeConsentSchema,
	screeningInputSchema,
	type ClientCreateInput,
	type ScreeningInputData
} from './schemas';

// Forms post flat fields; these turn them into the API's JSON shape so one schema checks
// both, and turn the schema's issues back into errors keyed by form field name. Pure and
// browser-safe: the pages also run them before submitting, for instant inline errors.

export type FormValues = Record<string, string | string[]>;
export type FormErrors = Record<string, string>;

export type FormResult<T> =
	{ ok: true; data: T; values: FormValues } | { ok: false; errors: FormErrors; values: FormValues };

/** Everything the person typed, to fill the form again after an error. */
export function formValues(form: FormData): FormValues {
	const values: FormValues = {};
	for (const key of new Set(form.keys())) {
		const all = form.getAll(key).filter((v): v is string => typeof v === 'string');
		values[key] = key === 'redFlags' ? all : (all[0] ?? '');
	}
	return values;
}

const str = (values: FormValues, key: string): string => {
	const value = values[key];
	return typeof value === 'string' ? value.trim() : '';
};

/** A number field: empty is absent, digits are a number, anything else stays text (an error). */
function num(values: FormValues, key: string): number | string | undefined {
	const raw = str(values, key);
	if (raw === '') return undefined;
	const n = Number(raw.replace(',', '.'));
	return Number.isFinite(n) ? n : raw;
}

function yesNo(values: FormValues, key: string): boolean | string | undefined {
	const raw = str(values, key);
	if (raw === 'yes') return true;
	if (raw === 'no') return false;
	return raw === '' ? undefined : raw;
}

/** Zod issue paths as form field names (`sites.above_navel.widthFingers` → `above_navel.widthFingers`). */
export function issuesToFormErrors(
	issues: readonly z.core.$ZodIssue[],
	rename: (path: string) => string = (p) => p
): FormErrors {
	const errors: FormErrors = {};
	for (const issue of issues) {
		const key = rename(issue.path.map(String).join('.')) || 'form';
		errors[key] ??= issue.message;
	}
	return errors;
}

/** Field names for pointers in problem details (`/sites/at_navel/depth` → `at_navel.depth`). */
export function pointerToField(pointer: string): string {
	return screeningField(pointer.replace(/^\//, '').split('/').join('.'));
}

function screeningField(path: string): string {
	return path.replace(/^sites\./, '');
}

function clientField(path: string): string {
	if (path === 'intakeConsent.at') return 'consentAt';
	if (path === 'intakeConsent.method' || path === 'intakeConsent') return 'consentMethod';
	return path;
}

export function screeningFromForm(form: FormData): FormResult<ScreeningInputData> {
	const values = formValues(form);
	const sites: Record<string, unknown> = {};
	for (const site of SITES) {
		sites[site] = {
			widthFingers: num(values, `${site}.widthFingers`),
			widthMm: num(values, `${site}.widthMm`) ?? null,
			depth: str(values, `${site}.depth`) || undefined,
			tension: str(values, `${site}.tension`) || undefined,
			doming: yesNo(values, `${site}.doming`)
		};
	}
	const parsed = screeningInputSchema.safeParse({
		takenAt: str(values, 'takenAt') || undefined,
		sites,
		redFlags: values.redFlags ?? [],
		notes: str(values, 'notes'),
		medicalSignResolved: str(values, 'medicalSignResolved') === 'yes' ? true : null
	});
	if (!parsed.success) {
		return { ok: false, values, errors: issuesToFormErrors(parsed.error.issues, screeningField) };
	}
	return { ok: true, data: parsed.data, values };
}

/** The client fields from the new-client or edit form, in the API's shape (before parsing). */
export function clientBodyFromForm(values: FormValues): Record<string, unknown> {
	const stage = str(values, 'stage') || undefined;
	const body: Record<string, unknown> = {
		name: str(values, 'name'),
		email: str(values, 'email'),
		birthYear: num(values, 'birthYear') ?? null,
		notes: str(values, 'notes'),
		stage
	};
	if (stage === 'pregnant') {
		body.dueDate = str(values, 'dueDate') || undefined;
	} else if (stage === 'postpartum') {
		body.birthDate = str(values, 'birthDate') || undefined;
		body.delivery = str(values, 'delivery') || undefined;
		body.births = num(values, 'births');
		body.multiples = yesNo(values, 'multiples') ?? false;
		body.postnatalCheckOn = str(values, 'postnatalCheckOn') || null;
		body.postnatalCleared = yesNo(values, 'postnatalCleared') ?? null;
	}
	return body;
}

export function clientFromForm(form: FormData): FormResult<ClientCreateInput> {
	const values = formValues(form);
	const body = clientBodyFromForm(values);
	const method = str(values, 'consentMethod');
	if (method !== '') {
		body.intakeConsent = { method, at: str(values, 'consentAt') || undefined };
	}
	const parsed = clientCreateSchema.safeParse(body);
	if (!parsed.success) {
		return { ok: false, values, errors: issuesToFormErrors(parsed.error.issues, clientField) };
	}
	return { ok: true, data: parsed.data, values };
}

export function consentFromForm(form: FormData): FormResult<z.infer<typeof intakeConsentSchema>> {
	const values = formValues(form);
	const parsed = intakeConsentSchema.safeParse({
		method: str(values, 'consentMethod') || undefined,
		at: str(values, 'consentAt') || undefined
	});
	if (!parsed.success) {
		return {
			ok: false,
			values,
			errors: issuesToFormErrors(parsed.error.issues, (p) => clientField(`intakeConsent.${p}`))
		};
	}
	return { ok: true, data: parsed.data, values };
}
