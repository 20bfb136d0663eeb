import {
	formValues,
	issuesToFormErrors,
	type FormErrors,
	type FormResult,
	type FormValues
} from '$lib/forms';
import { MOVEMENT_CATEGORIES } from '$lib/domain/movement';
import {
	assessmentSchema,
	clearanceSchema,
	type AssessmentData,
	type ClearanceData
} from './schemas';
import type { HerniaFinding } from './types';
import { HERNIA_HOLDS, POINT_ROWS } from './form-constants';

export { HERNIA_HOLDS, POINT_ROWS };

// The assessment and clearance forms post flat fields; these shape them like the API's JSON so
// one schema checks both, and turn its issues back into errors keyed by field name. Pure and
// browser-safe.

const str = (values: FormValues, key: string): string => {
	const value = values[key];
	return typeof value === 'string' ? value.trim() : '';
};

function num(values: FormValues, key: string): number | string | null {
	const raw = str(values, key);
	if (raw === '') return null;
	const n = Number(raw.replace(',', '.'));
	return Number.isFinite(n) ? n : raw;
}

function orNull(values: FormValues, key: string): string | null {
	return str(values, key) || null;
}

/** A point row counts once a width is filled in (its position and distance come preset). */
function rowUsed(values: FormValues, i: number): boolean {
	return ['restMm', 'curlUpMm'].some((f) => str(values, `p${i}.${f}`) !== '');
}

export function assessmentFromForm(form: FormData): FormResult<AssessmentData> & {
	rows: number[];
} {
	const values = formValues(form);
	const rows = Array.from({ length: POINT_ROWS }, (_, i) => i).filter((i) => rowUsed(values, i));
	const body = {
		points: rows.map((i) => ({
			position: str(values, `p${i}.position`),
			distanceCm: num(values, `p${i}.distanceCm`),
			restMm: num(values, `p${i}.restMm`),
			curlUpMm: num(values, `p${i}.curlUpMm`),
			method: str(values, `p${i}.method`),
			depth: orNull(values, `p${i}.depth`),
			tension: orNull(values, `p${i}.tension`),
			doming: str(values, `p${i}.doming`) === 'yes' ? true : null
		})),
		hernia: str(values, 'hernia'),
		pelvicFloor: str(values, 'pelvicFloor'),
		plan: str(values, 'plan')
	};
	const parsed = assessmentSchema.safeParse(body);
	if (!parsed.success) {
		return {
			ok: false,
			values,
			rows,
			// points.1.restMm → p{row}.restMm, the row's own field name.
			errors: issuesToFormErrors(parsed.error.issues, (path) => {
				const m = /^points\.(\d+)\.(\w+)$/.exec(path);
				if (m) return `p${rows[Number(m[1])]}.${m[2]}`;
				return path === 'points' ? 'p0.restMm' : path;
			})
		};
	}
	return { ok: true, data: parsed.data, values, rows };
}

export function clearanceFromForm(
	form: FormData,
	hernia: HerniaFinding | null
): FormResult<ClearanceData> {
	const values = formValues(form);
	const categories: Record<string, string> = {};
	const modifications: Record<string, string> = {};
	for (const category of MOVEMENT_CATEGORIES) {
		const level = str(values, `level.${category}`);
		if (level) categories[category] = level;
		const text = str(values, `mod.${category}`);
		// A text left in a box she then switched away from modify is not hers to keep.
		if (text && level === 'modify') modifications[category] = text;
	}
	const parsed = clearanceSchema.safeParse({
		referralId: str(values, 'referralId') || null,
		categories,
		modifications,
		notes: str(values, 'notes'),
		reviewOn: str(values, 'reviewOn')
	});
	const errors: FormErrors = parsed.success
		? {}
		: issuesToFormErrors(parsed.error.issues, (path) => {
				const m = /^(categories|modifications)\.(\w+)$/.exec(path);
				if (m) return `${m[1] === 'categories' ? 'level' : 'mod'}.${m[2]}`;
				return path === 'categories' ? 'form' : path;
			});
	for (const category of MOVEMENT_CATEGORIES) {
		if (!categories[category]) errors[`level.${category}`] ??= 'choose cleared, modify or hold';
		// Said at once, even while another field keeps the schema from reaching this rule.
		if (categories[category] === 'modify' && !modifications[category]) {
			errors[`mod.${category}`] ??= 'write the modification for a category you marked modify';
		}
	}
	if (hernia && hernia !== 'none' && str(values, 'confirmHernia') !== 'yes') {
		for (const category of HERNIA_HOLDS) {
			const level = categories[category];
			if (level && level !== 'hold') {
				errors[`level.${category}`] ??=
					`a hernia was recorded as ${hernia}: tick the confirmation below to ${level === 'modify' ? 'allow this with a change' : 'clear this'}`;
				errors.confirmHernia ??= 'confirm that you clear these despite the hernia finding';
			}
		}
	}
	if (!parsed.success || Object.keys(errors).length > 0) return { ok: false, values, errors };
	return { ok: true, data: parsed.data, values };
}
