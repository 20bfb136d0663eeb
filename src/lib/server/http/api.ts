import type { RequestEvent } from '@sveltejs/kit';
import { randomUUID } from 'node:crypto';
import { z } from 'zod';
import { describeError, isDatabaseUnavailable } from '../db/errors';
import { ProblemError, notFound, problem, validationProblem } from './problem';

// The JSON API's edge: one wrapper per endpoint that enforces the conventions (same-origin
// mutations, content types, problem details, never a stack trace) so each endpoint only
// parses, calls a service and answers.

const MUTATING = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

type Handler = (event: RequestEvent) => Promise<Response> | Response;

export interface ApiOptions {
	/** Content types a mutation may send; JSON by default. */
	accepts?: Array<'json' | 'multipart'>;
}

export function apiHandler(handler: Handler, options: ApiOptions = {}): Handler {
	const accepts = options.accepts ?? ['json'];
	return async (event) => {
		try {
			if (MUTATING.has(event.request.method)) {
				assertSameOrigin(event);
				assertContentType(event, accepts);
			}
			return await handler(event);
		} catch (error) {
			if (error instanceof ProblemError) return error.toResponse(event.url.pathname);
			return unexpectedProblem(event, error);
		}
	};
}

/**
 * The answer to an error nobody turned into a problem: 503 when the database is briefly gone
 * (nothing was committed; try again), else a 500 with a reference. The log gets the reference
 * and what failed — a query by name, never its parameters.
 */
export function unexpectedProblem(event: RequestEvent, error: unknown): Response {
	if (isDatabaseUnavailable(error)) return databaseUnavailable(event.url.pathname);
	const errorId = randomUUID();
	console.error(
		`[api ${errorId}] ${event.request.method} ${event.route.id ?? event.url.pathname}: ${describeError(error)}`
	);
	return problem('internal-error', {
		detail: `Something went wrong on our side. Reference ${errorId}.`,
		instance: event.url.pathname,
		errorId
	});
}

/** How long a client should wait before trying again after losing the database. */
export const RETRY_AFTER_SECONDS = 2;

export function databaseUnavailable(instance?: string): Response {
	return problem('database-unavailable', {
		detail:
			'Seamwell cannot reach its database for a moment. Nothing was saved; try again in a few seconds.',
		instance,
		headers: { 'Retry-After': String(RETRY_AFTER_SECONDS) }
	});
}

function assertSameOrigin(event: RequestEvent): void {
	const origin = event.request.headers.get('origin');
	if (!origin || origin !== event.url.origin) {
		throw new ProblemError('cross-origin', {
			detail: 'Changes must come from Seamwell itself: the Origin header is missing or foreign.'
		});
	}
}

/** A request with no body at all: no Content-Length (or 0) and no chunked body. */
function hasNoBody(request: Request): boolean {
	const length = request.headers.get('content-length');
	return (length === null || length === '0') && !request.headers.has('transfer-encoding');
}

function assertContentType(event: RequestEvent, accepts: Array<'json' | 'multipart'>): void {
	// A POST that takes no body (…/consents/{id}/withdraw) needs no Content-Type either;
	// an endpoint that reads a body then answers 400 (malformed JSON) or 422 as usual.
	if (!event.request.headers.has('content-type') && hasNoBody(event.request)) return;
	const type = (event.request.headers.get('content-type') ?? '')
		.split(';')[0]!
		.trim()
		.toLowerCase();
	const ok =
		(accepts.includes('json') && type === 'application/json') ||
		(accepts.includes('multipart') && type === 'multipart/form-data');
	if (!ok) {
		throw new ProblemError('unsupported-media-type', {
			detail: `Send ${accepts.map((a) => (a === 'json' ? 'application/json' : 'multipart/form-data')).join(' or ')}.`
		});
	}
}

/**
 * Reads and validates a JSON body: malformed → 400, schema error → 422 with pointers. One rule
 * for the whole API, POST and PATCH alike: a field the schema does not know is refused (422,
 * `unknown field` at its pointer), never silently dropped — a misspelt field must not look
 * saved.
 */
export async function readJson<T extends z.ZodType>(
	event: RequestEvent,
	schema: T
): Promise<z.infer<T>> {
	let body: unknown;
	try {
		body = await event.request.json();
	} catch {
		throw new ProblemError('malformed-json', { detail: 'The request body is not valid JSON.' });
	}
	const parsed = schema.safeParse(body);
	if (!parsed.success) throw validationProblem(parsed.error);
	const unknown = unknownFields(body, parsed.data);
	if (unknown.length > 0) {
		throw new ProblemError('validation-failed', {
			detail: `Unknown field${unknown.length === 1 ? '' : 's'}: ${unknown.join(', ')}`,
			errors: unknown.map((pointer) => ({ pointer, message: 'unknown field' }))
		});
	}
	return parsed.data;
}

const isPlainObject = (v: unknown): v is Record<string, unknown> =>
	typeof v === 'object' && v !== null && !Array.isArray(v) && !(v instanceof Date);

const pointerPart = (key: string) => key.replaceAll('~', '~0').replaceAll('/', '~1');

/**
 * JSON Pointers to the members of `input` that the schema left out of `output`. zod objects
 * drop keys they do not know; comparing what came in with what came out finds them at every
 * depth, whatever the schema is built of (unions, transforms, shared form schemas), so every
 * endpoint follows the rule without each schema restating it.
 */
export function unknownFields(input: unknown, output: unknown, at = ''): string[] {
	if (Array.isArray(input) && Array.isArray(output) && input.length === output.length) {
		return input.flatMap((item, i) => unknownFields(item, output[i], `${at}/${i}`));
	}
	if (!isPlainObject(input) || !isPlainObject(output)) return [];
	return Object.keys(input).flatMap((key) =>
		Object.hasOwn(output, key)
			? unknownFields(input[key], output[key], `${at}/${pointerPart(key)}`)
			: [`${at}/${pointerPart(key)}`]
	);
}

/** Validates query parameters; pointers name the parameter (`/limit`). */
export function readQuery<T extends z.ZodType>(url: URL, schema: T): z.infer<T> {
	const parsed = schema.safeParse(Object.fromEntries(url.searchParams));
	if (!parsed.success) throw validationProblem(parsed.error);
	return parsed.data;
}

const uuid = z.uuid();

/** A path id that is not a UUID cannot name a record: 404, like any record one may not see. */
export function readId(value: string | undefined): string {
	const parsed = uuid.safeParse(value);
	if (!parsed.success) throw notFound();
	return parsed.data;
}
