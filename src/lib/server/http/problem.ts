import { json } from '@sveltejs/kit';
import type { z } from 'zod';

// RFC 9457 problem details. Every `type` is a URI from Seamwell's published list below,
// served as documentation at /problems/<slug>.

export const PROBLEM_TYPES = {
	'malformed-json': { status: 400, title: 'The request body is not valid JSON' },
	'malformed-path': { status: 400, title: 'The address is not valid' },
	'validation-failed': { status: 422, title: 'The request has invalid fields' },
	unauthenticated: { status: 401, title: 'Sign-in required' },
	forbidden: { status: 403, title: 'Not allowed' },
	'cross-origin': { status: 403, title: 'Cross-origin request refused' },
	'not-found': { status: 404, title: 'Not found' },
	'unsupported-media-type': { status: 415, title: 'Unsupported content type' },
	'payload-too-large': { status: 413, title: 'Request body too large' },
	'rate-limited': { status: 429, title: 'Too many requests' },
	conflict: { status: 409, title: 'Conflict' },
	'intake-consent-required': { status: 409, title: 'Intake consent required' },
	'consent-required': { status: 409, title: 'Consent to share required' },
	'invalid-transition': { status: 409, title: 'Invalid state transition' },
	'duplicate-referral': { status: 409, title: 'An open referral already exists' },
	'storage-unavailable': { status: 503, title: 'Storage unavailable' },
	'database-unavailable': { status: 503, title: 'Database unavailable' },
	'internal-error': { status: 500, title: 'Internal error' }
} as const;

export type ProblemSlug = keyof typeof PROBLEM_TYPES;

export const problemTypeUri = (slug: ProblemSlug) => `/problems/${slug}`;

export interface FieldError {
	/** A JSON Pointer (RFC 6901) into the request body or query. */
	pointer: string;
	message: string;
}

export interface ProblemInit {
	detail: string;
	instance?: string;
	errors?: FieldError[];
	status?: number;
	headers?: Record<string, string>;
	[extension: string]: unknown;
}

export function problem(slug: ProblemSlug, init: ProblemInit): Response {
	const { detail, instance, errors, status, headers, ...extensions } = init;
	const known = PROBLEM_TYPES[slug];
	return json(
		{
			type: problemTypeUri(slug),
			title: known.title,
			status: status ?? known.status,
			detail,
			...(instance ? { instance } : {}),
			...(errors ? { errors } : {}),
			...extensions
		},
		{
			status: status ?? known.status,
			headers: { 'Content-Type': 'application/problem+json', ...headers }
		}
	);
}

/** A thrown problem: services and helpers throw it, `apiHandler` turns it into a response. */
export class ProblemError extends Error {
	constructor(
		readonly slug: ProblemSlug,
		readonly init: ProblemInit
	) {
		super(init.detail);
	}
	toResponse(instance?: string): Response {
		return problem(this.slug, { instance, ...this.init });
	}
}

export const notFound = (detail = 'No such record, or it is not available to you.') =>
	new ProblemError('not-found', { detail });

/** Turns a zod error into field errors with JSON Pointers (`/sites/above_navel/widthFingers`). */
export function fieldErrors(error: z.ZodError, prefix = ''): FieldError[] {
	return error.issues.map((issue) => ({
		pointer:
			prefix +
			(issue.path.length
				? '/' +
					issue.path.map((p) => String(p).replaceAll('~', '~0').replaceAll('/', '~1')).join('/')
				: ''),
		message: issue.message
	}));
}

/** A 422 about one field, for rules zod cannot see (an unknown clinic, a client elsewhere). */
export const fieldProblem = (pointer: string, message: string, detail: string) =>
	new ProblemError('validation-failed', { detail, errors: [{ pointer, message }] });

export function validationProblem(error: z.ZodError, prefix = ''): ProblemError {
	const errors = fieldErrors(error, prefix);
	return new ProblemError('validation-failed', {
		detail: `${errors.length} field${errors.length === 1 ? '' : 's'} need${errors.length === 1 ? 's' : ''} attention: ${errors
			.map((e) => e.pointer || '(body)')
			.join(', ')}`,
		errors
	});
}
