import { z } from 'zod';
import { AUDIT_ACTIONS, AUDIT_OUTCOMES } from '../actions';
import { text } from '../../http/schemas';

// The review's filters, as the API and the page read them from the URL. An empty parameter
// (a GET form's untouched field) means "no filter"; anything else malformed is a 422 that
// names the parameter.

const blank = (value: unknown) => (value === '' ? undefined : value);
const optional = <T extends z.ZodType>(schema: T) => z.preprocess(blank, schema.optional());

const DAY = /^\d{4}-\d{2}-\d{2}$/;

/** A calendar day (YYYY-MM-DD, UTC) or an ISO 8601 time with an offset. */
const instant = text(40).refine(
	(s) =>
		(DAY.test(s) || z.iso.datetime({ offset: true }).safeParse(s).success) && !isNaN(Date.parse(s)),
	'must be a date (YYYY-MM-DD) or an ISO 8601 time with an offset'
);

export const MAX_LIMIT = 200;

export const reviewQuery = z
	.object({
		actor: optional(z.uuid('must be a person’s id')),
		client: optional(z.uuid('must be a client’s id')),
		action: optional(z.enum(AUDIT_ACTIONS, 'not an action code this log uses')),
		outcome: optional(z.enum(AUDIT_OUTCOMES, 'must be success, refused or failed')),
		target: optional(
			text(200).regex(/^[a-z_]{1,40}:[^\s]{1,120}$/, 'must be type:id, e.g. referral:<id>')
		),
		from: optional(instant),
		to: optional(instant),
		limit: z.preprocess(
			blank,
			z.coerce
				.number('must be a number')
				.int('must be a whole number')
				.min(1, `must be 1 to ${MAX_LIMIT}`)
				.max(MAX_LIMIT, `must be 1 to ${MAX_LIMIT}`)
				.default(50)
		),
		cursor: optional(text(200))
	})
	.superRefine((q, ctx) => {
		const range = timeRange(q);
		if (range.from && range.before && range.from >= range.before) {
			ctx.addIssue({ code: 'custom', path: ['from'], message: 'must not be after `to`' });
		}
	});

export type ReviewQuery = z.infer<typeof reviewQuery>;

/** `from` inclusive and `to` as an exclusive bound: a day named in `to` counts whole. */
export function timeRange(q: { from?: string; to?: string }): { from?: Date; before?: Date } {
	const from = q.from ? new Date(DAY.test(q.from) ? `${q.from}T00:00:00Z` : q.from) : undefined;
	let before: Date | undefined;
	if (q.to) {
		before = DAY.test(q.to)
			? new Date(Date.parse(`${q.to}T00:00:00Z`) + 86_400_000)
			: new Date(Date.parse(q.to) + 1);
	}
	return { from, before };
}

/** The filters alone (no paging), as recorded with an export and shown in a file name. */
export function filterOf(q: ReviewQuery): Record<string, string> {
	const out: Record<string, string> = {};
	for (const key of ['actor', 'client', 'action', 'outcome', 'target', 'from', 'to'] as const) {
		if (q[key]) out[key] = q[key]!;
	}
	return out;
}
