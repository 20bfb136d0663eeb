import { z } from 'zod';
import { SITES } from '$lib/domain';
import {
	formValues,
	numberOf,
	parseForm,
	textOf,
	yesNoOf,
	type FormResult,
	type FormValues
} from '$lib/forms';
import {
	clientCommonSchema,
	clientCreateSchema,
	clientFieldsSchema,
	intakeConsentSchema,
	screeningInputSchema,
	type ClientCreateInput,
	type ClientFields,
	type ScreeningInputData
} from './schemas';
import { CLIENT_WORDS, SCREENING_WORDS } from './words';

export { CLIENT_WORDS, SCREENING_WORDS };

// The client and screening forms post flat fields; these turn them into the API's JSON shape so
// one schema checks both, and name every problem by its form field, in words for people. Pure
// and browser-safe: the pages also run them before submitting, for instant inline errors.

/** Problem pointers and issue paths of the screening API as form fields (`sites.at_navel.depth` → `at_navel.depth`). */
export const screeningField = (path: string) => path.replace(/^sites\./, '');

/** Problem pointers and issue paths of the client API as form fields (`intakeConsent.at` → `consentAt`). */
export function clientField(path: string): string {
	if (path === 'intakeConsent.at') return 'consentAt';
	if (path === 'intakeConsent.method' || path === 'intakeConsent') return 'consentMethod';
	return path;
}

export function screeningFromForm(form: FormData): FormResult<ScreeningInputData> {
	const values = formValues(form, ['redFlags']);
	const sites: Record<string, unknown> = {};
	for (const site of SITES) {
		sites[site] = {
			widthFingers: numberOf(values, `${site}.widthFingers`),
			widthMm: numberOf(values, `${site}.widthMm`) ?? null,
			depth: textOf(values, `${site}.depth`) || undefined,
			tension: textOf(values, `${site}.tension`) || undefined,
			doming: yesNoOf(values, `${site}.doming`)
		};
	}
	const body = {
		takenAt: textOf(values, 'takenAt') || undefined,
		sites,
		redFlags: values.redFlags,
		notes: textOf(values, 'notes'),
		medicalSignResolved: textOf(values, 'medicalSignResolved') === 'yes' ? true : null
	};
	return parseForm(screeningInputSchema, body, values, {
		rename: screeningField,
		words: SCREENING_WORDS
	});
}

/** The client fields from the new-client or edit form, in the API's shape (before parsing). */
export function clientBodyFromForm(values: FormValues): Record<string, unknown> {
	const stage = textOf(values, 'stage') || undefined;
	const body: Record<string, unknown> = {
		name: textOf(values, 'name'),
		email: textOf(values, 'email'),
		birthYear: numberOf(values, 'birthYear') ?? null,
		notes: textOf(values, 'notes'),
		stage
	};
	if (stage === 'pregnant') {
		body.dueDate = textOf(values, 'dueDate') || undefined;
	} else if (stage === 'postpartum') {
		body.birthDate = textOf(values, 'birthDate') || undefined;
		body.delivery = textOf(values, 'delivery') || undefined;
		body.births = numberOf(values, 'births');
		body.multiples = yesNoOf(values, 'multiples') ?? false;
		body.postnatalCheckOn = textOf(values, 'postnatalCheckOn') || null;
		body.postnatalCleared = yesNoOf(values, 'postnatalCleared') ?? null;
	}
	return body;
}

/**
 * A client schema parse that reports every field at once: without a stage the union knows
 * only that the stage is missing, so the fields both stages share are checked as well.
 */
function parseClient<T extends z.ZodType>(
	schema: T,
	body: Record<string, unknown>,
	values: FormValues
): FormResult<z.infer<T>> {
	const parsed = parseForm(schema, body, values, { rename: clientField, words: CLIENT_WORDS });
	if (parsed.ok || body.stage === 'pregnant' || body.stage === 'postpartum') return parsed;
	const common = parseForm(clientCommonSchema.extend({ stage: z.unknown() }), body, values, {
		rename: clientField,
		words: CLIENT_WORDS
	});
	const consent = body.intakeConsent
		? parseForm(intakeConsentSchema, body.intakeConsent, values, {
				rename: (p) => clientField(`intakeConsent.${p}`),
				words: CLIENT_WORDS
			})
		: null;
	return {
		ok: false,
		values,
		errors: {
			...(common.ok ? {} : common.errors),
			...(consent && !consent.ok ? consent.errors : {}),
			...parsed.errors
		}
	};
}

export function clientFromForm(form: FormData): FormResult<ClientCreateInput> {
	const values = formValues(form);
	const body = clientBodyFromForm(values);
	const method = textOf(values, 'consentMethod');
	if (method !== '') {
		body.intakeConsent = { method, at: textOf(values, 'consentAt') || undefined };
	}
	return parseClient(clientCreateSchema, body, values);
}

/** The edit form: the whole record, checked before the service merges it (which checks again). */
export function clientEditFromForm(
	form: FormData
): FormResult<ClientFields> & { body: Record<string, unknown> } {
	const values = formValues(form);
	const body = clientBodyFromForm(values);
	return { ...parseClient(clientFieldsSchema, body, values), body };
}

export function consentFromForm(form: FormData): FormResult<z.infer<typeof intakeConsentSchema>> {
	const values = formValues(form);
	const body = {
		method: textOf(values, 'consentMethod') || undefined,
		at: textOf(values, 'consentAt') || undefined
	};
	return parseForm(intakeConsentSchema, body, values, {
		rename: (p) => clientField(`intakeConsent.${p}`),
		words: CLIENT_WORDS
	});
}
