import { z } from 'zod';
import { text, requiredText, optionalText } from '$lib/schemas/text';
import { CONSENT_METHODS, DELIVERIES, CLIENT_SORTS, NEEDS } from './constants';
import {
	DEPTHS,
	FINGER_WIDTH_MAX,
	FINGER_WIDTH_MIN,
	isValidFingerWidth,
	RED_FLAGS,
	SITES,
	TENSIONS
} from '$lib/domain';

// Input schemas for client records and screenings, shared by the JSON API, the form actions
// and the browser (so this module must stay free of server imports). The API reads JSON
// into them directly; the forms first turn FormData into the same shape (see ./form.ts).

/** A few minutes' grace for clocks that run slightly ahead of the server's. */
const FUTURE_GRACE_MS = 5 * 60_000;
const MS_PER_DAY = 86_400_000;

/** Strings refuse NUL characters, which PostgreSQL cannot store in text. */

const number = (what = 'a number') =>
	z.number({
		error: (issue) => (issue.input === undefined ? 'required' : `must be ${what}`)
	});

const todayUtc = () => new Date().toISOString().slice(0, 10);

/** A calendar day, YYYY-MM-DD. */
const day = z.iso.date({ error: 'must be a date (YYYY-MM-DD)' });

/**
 * A calendar day no later than today. "Today" is hers, not UTC's: just after her midnight in
 * a zone ahead of UTC, her today is still tomorrow in UTC, so one day of grace (as pastMoment).
 */
const dayNotAfterToday = day.refine((value) => {
	const tomorrowUtc = new Date(Date.parse(`${todayUtc()}T00:00:00Z`) + MS_PER_DAY);
	return value <= tomorrowUtc.toISOString().slice(0, 10);
}, 'must not be in the future');

/**
 * When something happened: a full timestamp with its offset, or a calendar day. A day alone
 * reads as noon UTC that day, or as now when that is earlier — so "today" entered in any time
 * zone is never in the future. A day up to one ahead of UTC is accepted for zones east of it.
 */
export const pastMoment = z
	.union([z.iso.datetime({ offset: true }), day], {
		error: 'must be a date (YYYY-MM-DD) or a date and time with its offset'
	})
	.transform((value, ctx) => {
		const now = Date.now();
		if (value.length === 10) {
			const noon = Date.parse(`${value}T12:00:00Z`);
			const tomorrow = Date.parse(`${todayUtc()}T00:00:00Z`) + MS_PER_DAY;
			if (noon > tomorrow + MS_PER_DAY) {
				ctx.addIssue({ code: 'custom', message: 'must not be in the future' });
				return z.NEVER;
			}
			return new Date(Math.min(noon, now));
		}
		const at = new Date(value);
		if (at.getTime() > now + FUTURE_GRACE_MS) {
			ctx.addIssue({ code: 'custom', message: 'must not be in the future' });
			return z.NEVER;
		}
		return at;
	});

export const siteMeasureSchema = z.object({
	widthFingers: number('a number of finger widths').refine(
		isValidFingerWidth,
		`must be ${FINGER_WIDTH_MIN} to ${FINGER_WIDTH_MAX} finger widths in half steps`
	),
	widthMm: number('a number of millimetres')
		.min(0, 'must be 0 or more')
		.max(300, 'must be at most 300 mm')
		.nullable()
		.optional(),
	depth: z.enum(DEPTHS, { error: `must be one of ${DEPTHS.join(', ')}` }),
	tension: z.enum(TENSIONS, { error: `must be one of ${TENSIONS.join(', ')}` }),
	doming: z.boolean({ error: 'must be yes or no' })
});

/**
 * Refuses any value, for keys a schema does not know: each gets its own issue at its own path
 * (zod's strict mode reports them all at the parent, which names no field).
 */
const refused = (message: string) => z.custom<never>(() => false, { error: message });

const siteShape = Object.fromEntries(SITES.map((site) => [site, siteMeasureSchema])) as Record<
	(typeof SITES)[number],
	typeof siteMeasureSchema
>;

/** Every site is required; a site we do not know is named by its own pointer. */
export const sitesSchema = z
	.object(siteShape, { error: 'must give all three sites' })
	.catchall(refused('unknown site'))
	.transform((sites) => ({
		above_navel: sites.above_navel,
		at_navel: sites.at_navel,
		below_navel: sites.below_navel
	}));

export const screeningInputSchema = z.object({
	takenAt: pastMoment,
	sites: sitesSchema,
	redFlags: z
		.array(z.enum(RED_FLAGS, { error: 'unknown red-flag code' }), {
			error: 'must be a list of red-flag codes'
		})
		.max(RED_FLAGS.length)
		.default([])
		.transform((flags) => [...new Set(flags)]),
	notes: optionalText(4000),
	/**
	 * She has been seen by her doctor or midwife for an earlier warning sign, and it has gone.
	 * Asked only when an earlier screening had a sign that refers to a doctor.
	 */
	medicalSignResolved: z
		.boolean({ error: 'must be true or false' })
		.nullable()
		.optional()
		.transform((v) => v ?? null)
});
export type ScreeningInputData = z.infer<typeof screeningInputSchema>;

export const intakeConsentSchema = z.object({
	at: pastMoment,
	method: z.enum(CONSENT_METHODS, { error: `must be one of ${CONSENT_METHODS.join(', ')}` })
});

const thisYear = () => new Date().getUTCFullYear();

const clientCommon = {
	name: requiredText(200),
	email: text(254)
		.transform((s) => s.trim().toLowerCase())
		.pipe(z.union([z.literal(''), z.email('not a valid e-mail address')]))
		.transform((s) => (s === '' ? null : s))
		.nullable()
		.optional(),
	birthYear: number('a year')
		.int('must be a whole year')
		.min(1900, 'must be 1900 or later')
		.refine((year) => year <= thisYear() - 10, 'must be at least ten years ago')
		.nullable()
		.optional(),
	notes: optionalText(4000)
};

/** The fields both stages share (the forms check them even before a stage is chosen). */
export const clientCommonSchema = z.object(clientCommon);

/** A due date may lie up to 44 weeks ahead, or up to 6 weeks behind (a late birth not yet recorded). */
const dueDate = day.refine((value) => {
	const due = Date.parse(`${value}T00:00:00Z`);
	const today = Date.parse(`${todayUtc()}T00:00:00Z`);
	return due <= today + 44 * 7 * MS_PER_DAY && due >= today - 6 * 7 * MS_PER_DAY;
}, 'must be within 44 weeks from today and not more than 6 weeks ago');

export const pregnantFields = z.object({
	...clientCommon,
	stage: z.literal('pregnant'),
	dueDate
});

export const postpartumFields = z.object({
	...clientCommon,
	stage: z.literal('postpartum'),
	birthDate: dayNotAfterToday,
	delivery: z.enum(DELIVERIES, { error: `must be one of ${DELIVERIES.join(', ')}` }),
	births: number('a whole number')
		.int('must be a whole number')
		.min(1, 'must be 1 or more')
		.max(20, 'must be at most 20'),
	multiples: z.boolean({ error: 'must be yes or no' }),
	postnatalCheckOn: dayNotAfterToday.nullable().optional(),
	postnatalCleared: z.boolean({ error: 'must be yes or no' }).nullable().optional()
});

const stageError = { error: 'must be pregnant or postpartum' };

/** The client record's own fields, either stage. */
export const clientFieldsSchema = z
	.discriminatedUnion('stage', [pregnantFields, postpartumFields], stageError)
	.superRefine((value, ctx) => {
		if (value.stage !== 'postpartum' || !value.postnatalCheckOn) return;
		if (value.postnatalCheckOn < value.birthDate) {
			ctx.addIssue({
				code: 'custom',
				path: ['postnatalCheckOn'],
				message: 'must not be before the birth date'
			});
		}
	});
export type ClientFields = z.infer<typeof clientFieldsSchema>;

/** POST /api/v1/clients and the new-client form. */
export const clientCreateSchema = z
	.discriminatedUnion(
		'stage',
		[
			pregnantFields.extend({
				intakeConsent: intakeConsentSchema.nullable().optional(),
				organisationId: z.uuid('must be an organisation id').optional()
			}),
			postpartumFields.extend({
				intakeConsent: intakeConsentSchema.nullable().optional(),
				organisationId: z.uuid('must be an organisation id').optional()
			})
		],
		stageError
	)
	.superRefine((value, ctx) => {
		if (value.stage !== 'postpartum' || !value.postnatalCheckOn) return;
		if (value.postnatalCheckOn < value.birthDate) {
			ctx.addIssue({
				code: 'custom',
				path: ['postnatalCheckOn'],
				message: 'must not be before the birth date'
			});
		}
	});
export type ClientCreateInput = z.infer<typeof clientCreateSchema>;

/**
 * PATCH /api/v1/clients/{id}: any of the record's fields, and the intake consent. The service
 * merges the patch into the record and checks the whole with `clientFieldsSchema`.
 */
const patchShape = {
	name: z.unknown(),
	email: z.unknown(),
	birthYear: z.unknown(),
	notes: z.unknown(),
	stage: z.unknown(),
	dueDate: z.unknown(),
	birthDate: z.unknown(),
	delivery: z.unknown(),
	births: z.unknown(),
	multiples: z.unknown(),
	postnatalCheckOn: z.unknown(),
	postnatalCleared: z.unknown(),
	intakeConsent: intakeConsentSchema.optional()
};

export const clientPatchSchema = z.object(patchShape).partial().catchall(refused('unknown field'));
/** A patch as the service takes it: record fields (checked after merging) and the consent. */
export type ClientPatchInput = Record<string, unknown> & {
	intakeConsent?: z.infer<typeof intakeConsentSchema>;
};

/** GET /api/v1/clients query (limit and cursor are added on the server). */
export const clientListFilterSchema = z.object({
	search: text(100)
		.transform((s) => s.trim())
		.optional(),
	needs: z.enum(NEEDS, { error: 'must be referral or screening' }).optional(),
	sort: z.enum(CLIENT_SORTS, { error: 'must be name or lastScreenedAt' }).default('name')
});
export type ClientListFilter = z.infer<typeof clientListFilterSchema>;

export {
	DELIVERIES,
	CONSENT_METHODS,
	CONSENT_METHOD_LABELS,
	NEEDS,
	CLIENT_SORTS,
	SCREENING_DUE_WEEKS,
	type ConsentMethod,
	type Needs,
	type ClientSort
} from './constants';
