import { error, fail, type ActionFailure } from '@sveltejs/kit';
import {
	plainMessage,
	pointerToPath,
	type FormErrors,
	type FormValues,
	type FormWords
} from '$lib/forms';
import { ProblemError } from './problem';

// Form actions call the same services as the JSON API. This is the one way a form action
// answers: bad input or a refused service call is `fail(status, { form, values, errors })` —
// the form again with what was typed, every field's error beside its field and any message
// that belongs to no field under `errors.form`; success is `{ form, done }`. `form` names
// which of a page's forms answered (pages with one form leave it out). A not-found problem
// is the designed 404 page, never a form message that would confirm a record exists.

export interface FormFailureData {
	form?: string;
	values: FormValues;
	errors: FormErrors;
}
export type FormFailure = ActionFailure<FormFailureData>;

export interface FormOptions {
	/** Which of the page's forms answered. */
	form?: string;
	/** Problem pointer paths (`sites.at_navel.depth`) as the form's field names. */
	rename?: (path: string) => string;
	/** The form's words, to say field errors from the service in its own terms. */
	words?: FormWords;
}

/** Bad input caught by the form's own parser: 400 with every field's error. */
export function failForm(
	values: FormValues,
	errors: FormErrors,
	{ form }: Pick<FormOptions, 'form'> = {}
): FormFailure {
	return fail(400, { ...(form ? { form } : {}), values, errors });
}

/** A service's refusal as the form's answer; anything that is not a problem is rethrown. */
export function failFromProblem(
	caught: unknown,
	values: FormValues = {},
	{ form, rename = (p) => p, words = {} }: FormOptions = {}
): FormFailure {
	if (!(caught instanceof ProblemError)) throw caught;
	const status = caught.toResponse().status;
	if (status === 404) error(404, caught.init.detail);
	const errors: FormErrors = {};
	for (const fieldError of caught.init.errors ?? []) {
		const key = rename(pointerToPath(fieldError.pointer)) || 'form';
		errors[key] ??= plainMessage(words, key, fieldError.message);
	}
	if (Object.keys(errors).length === 0) errors.form = caught.init.detail;
	return fail(status === 422 ? 400 : status, { ...(form ? { form } : {}), values, errors });
}

/** A form's success: which form, and the confirmation to show (it replaces any earlier one). */
export function formDone<F extends string | undefined>(done: string, form?: F) {
	return { form, done };
}
