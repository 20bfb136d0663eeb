import { z } from 'zod';
import { ProblemError } from './problem';

// Building blocks shared by every input schema. PostgreSQL cannot store NUL characters in
// text, so every string refuses them at the edge.

export const text = (max = 2000) =>
	z
		.string()
		.max(max, `at most ${max} characters`)
		.refine((s) => !s.includes('\u0000'), 'must not contain NUL characters');

export const requiredText = (max = 2000) =>
	text(max)
		.transform((s) => s.trim())
		.pipe(z.string().min(1, 'required'));

export const email = text(254)
	.transform((s) => s.trim().toLowerCase())
	.pipe(z.email('not a valid e-mail address'));

/** `?limit=` and `?cursor=`: every list takes them. */
export const pageQuery = z.object({
	limit: z.coerce.number().int().min(1).max(100).default(25),
	cursor: text(500).optional()
});

export interface Page<T> {
	items: T[];
	nextCursor: string | null;
}

/** Opaque cursors: base64url of a small JSON value (e.g. the last row's sort key and id). */
export function encodeCursor(value: unknown): string {
	return Buffer.from(JSON.stringify(value)).toString('base64url');
}

/** What cursor keys may hold; each list's cursor schema says which one its sort key is. */
export const cursorKey = {
	/** A text sort key (a name): no NUL, bounded. */
	text: z.string().max(500),
	/** A moment as `toISOString()` wrote it: exactly that form, and a real date. */
	moment: z.iso
		.datetime()
		.refine((s) => !Number.isNaN(Date.parse(s)) && new Date(s).toISOString() === s),
	id: z.uuid()
};

const BASE64URL = /^[A-Za-z0-9_-]+$/;

function containsNul(value: unknown): boolean {
	if (typeof value === 'string') return value.includes('\u0000');
	if (Array.isArray(value)) return value.some(containsNul);
	if (value && typeof value === 'object') {
		return Object.entries(value).some(([k, v]) => k.includes('\u0000') || containsNul(v));
	}
	return false;
}

/**
 * Reads a cursor made by `encodeCursor`, checked against the list's schema — for a sorted
 * list, the schema of the sort in use, so a key of the wrong type never reaches SQL. Anything
 * else (not base64url, not JSON, a NUL anywhere, a key of the wrong type) is a 422 on
 * `/cursor`, never a database error.
 */
export function decodeCursor<T extends z.ZodType>(
	cursor: string | undefined,
	schema: T
): z.infer<T> | null {
	if (!cursor) return null;
	let value: unknown;
	try {
		if (!BASE64URL.test(cursor)) throw new Error('not base64url');
		const bytes = Buffer.from(cursor, 'base64url');
		value = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
	} catch {
		value = undefined;
	}
	const parsed = containsNul(value) ? null : schema.safeParse(value);
	if (!parsed?.success) {
		throw new ProblemError('validation-failed', {
			detail: 'The cursor is not one this list handed out.',
			errors: [{ pointer: '/cursor', message: 'unknown cursor' }]
		});
	}
	return parsed.data;
}

/** Fetch `limit + 1` rows, then call this: it trims the extra row and makes the next cursor. */
export function toPage<T>(rows: T[], limit: number, cursorOf: (last: T) => unknown): Page<T> {
	const items = rows.slice(0, limit);
	const last = items.at(-1);
	return {
		items,
		nextCursor: rows.length > limit && last !== undefined ? encodeCursor(cursorOf(last)) : null
	};
}
