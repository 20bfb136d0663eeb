import type { z } from 'zod';

// How every form in Seamwell reads its fields and reports what to fix. Browser-safe: pages run
// the same parsers before submitting (instant errors) and form actions run them again on the
// server (the no-JavaScript path). The JSON API keeps zod's precise messages and pointers;
// forms say the same in words for people, through each form's `FormWords`.

/** What the person typed, by field name (lists for repeated fields such as checkboxes). */
export type FormValues = Record<string, string | string[]>;
/** One message per field name; `form` holds a message that belongs to no single field. */
export type FormErrors = Record<string, string>;

export type FormResult<T> =
	{ ok: true; data: T; values: FormValues } | { ok: false; errors: FormErrors; values: FormValues };

/**
 * Words for one field: its `label` (the error summary's link text, and the start of a sentence
 * for a rule it broke) and `missing`, the plain request when the value is empty or not the
 * kind asked for ("Choose how the baby was born").
 */
export interface FieldWords {
	label: string;
	missing?: string;
}
export type FormWords = Record<string, FieldWords>;

/** Everything the person typed, to fill the form again after an error. */
export function formValues(form: FormData, lists: readonly string[] = []): FormValues {
	const values: FormValues = {};
	for (const key of new Set(form.keys())) {
		const all = form.getAll(key).filter((v): v is string => typeof v === 'string');
		values[key] = lists.includes(key) ? all : (all[0] ?? '');
	}
	for (const key of lists) values[key] ??= [];
	return values;
}

/** A field's trimmed text ('' when absent or a list). */
export function textOf(values: FormValues, key: string): string {
	const value = values[key];
	return typeof value === 'string' ? value.trim() : '';
}

/** A field's values as a list. */
export function listOf(values: FormValues, key: string): string[] {
	const value = values[key];
	return Array.isArray(value) ? value : typeof value === 'string' && value !== '' ? [value] : [];
}

/** A number field: empty is absent, digits are a number, anything else stays text (an error). */
export function numberOf(values: FormValues, key: string): number | string | undefined {
	const raw = textOf(values, key);
	if (raw === '') return undefined;
	const n = Number(raw.replace(',', '.'));
	return Number.isFinite(n) ? n : raw;
}

/** A yes/no field: 'yes' and 'no' are booleans, empty is absent, anything else stays (an error). */
export function yesNoOf(values: FormValues, key: string): boolean | string | undefined {
	const raw = textOf(values, key);
	if (raw === 'yes') return true;
	if (raw === 'no') return false;
	return raw === '' ? undefined : raw;
}

// Issue kinds that mean "empty, or not the kind of value asked for": answered with `missing`.
const MISSING_CODES = new Set(['invalid_type', 'invalid_value', 'invalid_union', 'invalid_format']);

function isMissing(issue: z.core.$ZodIssue): boolean {
	if (MISSING_CODES.has(issue.code)) return true;
	return issue.code === 'too_small' && issue.origin === 'string' && Number(issue.minimum) <= 1;
}

/** "Birth date" + "must not be in the future" → "Birth date must not be in the future." */
export function sentence(label: string, message: string): string {
	if (/^[A-Z]/.test(message)) return message;
	const verb = /^(at most|at least|one of)\b/.test(message) ? 'must be ' : '';
	const text = `${label} ${verb}${message}`;
	return /[.!?]$/.test(text) ? text : `${text}.`;
}

/** A message for one field in the form's words (or the message itself when it has none). */
export function plainMessage(
	words: FormWords,
	key: string,
	message: string,
	missing = false
): string {
	const field = words[key];
	if (!field) return message;
	if (missing && field.missing) return field.missing;
	return sentence(field.label, message);
}

/**
 * Zod issues as one message per form field, every field at once. `rename` turns an issue path
 * (`sites.above_navel.widthFingers`) into the form's field name (`above_navel.widthFingers`).
 */
export function issuesToFormErrors(
	issues: readonly z.core.$ZodIssue[],
	rename: (path: string) => string = (p) => p,
	words: FormWords = {}
): FormErrors {
	const errors: FormErrors = {};
	for (const issue of issues) {
		const key = rename(issue.path.map(String).join('.')) || 'form';
		errors[key] ??= plainMessage(words, key, issue.message, isMissing(issue));
	}
	return errors;
}

/** A problem's JSON pointer as a dotted path (`/sites/at_navel/depth` → `sites.at_navel.depth`). */
export function pointerToPath(pointer: string): string {
	return pointer.replace(/^\//, '').split('/').join('.');
}

/** Parses a form's body with its schema; failures name every field at once, in the form's words. */
export function parseForm<T extends z.ZodType>(
	schema: T,
	body: unknown,
	values: FormValues,
	options: { rename?: (path: string) => string; words?: FormWords } = {}
): FormResult<z.infer<T>> {
	const parsed = schema.safeParse(body);
	if (parsed.success) return { ok: true, data: parsed.data, values };
	return {
		ok: false,
		values,
		errors: issuesToFormErrors(parsed.error.issues, options.rename, options.words)
	};
}

/** The id of a field's element, for the error summary's links (`at_navel.depth` → `at_navel-depth`). */
export const fieldId = (key: string) => key.replaceAll('.', '-');

/** The labels of a form's words, for the error summary. */
export const labelsOf = (words: FormWords): Record<string, string> =>
	Object.fromEntries(Object.entries(words).map(([key, field]) => [key, field.label]));
