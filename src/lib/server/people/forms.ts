import { error, fail, type ActionFailure } from '@sveltejs/kit';
import { PROBLEM_TYPES, ProblemError } from '../http/problem';

// Form actions call the same services as the JSON API; these turn a service's problem into a
// form that says what to fix (pages use http/page.ts forPage).

export type FormErrors = Record<string, string>;

/** A form action's answer to a refused service call: the form again, with a plain message. */
export function formFailure<V extends Record<string, unknown>>(
	e: unknown,
	values: V
): ActionFailure<{ values: V; errors: FormErrors }> {
	if (!(e instanceof ProblemError)) throw e;
	const status = e.init.status ?? PROBLEM_TYPES[e.slug].status;
	if (status === 404) error(404, e.init.detail);
	const errors: FormErrors = { form: e.init.detail };
	for (const field of e.init.errors ?? []) errors[field.pointer.replace(/^\//, '')] = field.message;
	return fail(status === 422 ? 400 : status, { values, errors });
}

/** zod issues as one message per field, for `fail(400, { values, errors })`. */
export function fieldMessages(issues: Array<{ path: PropertyKey[]; message: string }>): FormErrors {
	const errors: FormErrors = {};
	for (const issue of issues) {
		const key = String(issue.path[0] ?? 'form');
		errors[key] ??= issue.message;
	}
	return errors;
}
