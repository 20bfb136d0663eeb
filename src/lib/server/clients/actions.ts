import { error, fail, type ActionFailure } from '@sveltejs/kit';
import { pointerToField, type FormErrors, type FormValues } from '$lib/clients/form';
import { ProblemError } from '../http/problem';

// Form actions call the same service functions as the API; this turns the service's problems
// into what a form shows: field errors beside their fields, or one message above the form.

export type FormFailure = ActionFailure<{ values: FormValues; errors: FormErrors }>;

export function failFromProblem(
	caught: unknown,
	values: FormValues,
	rename: (field: string) => string = (f) => f
): FormFailure {
	if (!(caught instanceof ProblemError)) throw caught;
	if (caught.slug === 'not-found') error(404, 'Not found');
	const errors: FormErrors = {};
	for (const fieldError of caught.init.errors ?? []) {
		errors[rename(pointerToField(fieldError.pointer)) || 'form'] ??= fieldError.message;
	}
	if (Object.keys(errors).length === 0) errors.form = caught.init.detail;
	const status =
		caught.slug === 'validation-failed' ? 400 : (caught.init.status ?? statusOf(caught));
	return fail(status, { values, errors });
}

function statusOf(problem: ProblemError): number {
	return problem.toResponse().status;
}
