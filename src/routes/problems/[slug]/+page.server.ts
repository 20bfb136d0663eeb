import { error } from '@sveltejs/kit';
import { PROBLEM_TYPES, type ProblemSlug } from '$lib/server/http/problem';
import type { PageServerLoad } from './$types';

// Each problem type's URI (`type` in an RFC 9457 answer) is a page that explains it.
const EXPLANATIONS: Record<ProblemSlug, string> = {
	'malformed-json': 'The body could not be read as JSON. Send a well-formed JSON document.',
	'malformed-path':
		'The address holds a percent-encoding (`%` and two hex digits) that does not decode to text. Check how the address was built.',
	'validation-failed':
		'The JSON was read, but some fields are missing or invalid. `errors` lists each one with a JSON Pointer to the field and a message.',
	unauthenticated: 'The request carries no valid session. Sign in, then send it again.',
	forbidden: 'You are signed in, but your role may not do this.',
	'cross-origin':
		'Changes must come from Seamwell’s own pages: the Origin header was missing or named another site.',
	'not-found':
		'No such record, or one you may not know of. Seamwell answers the same in both cases, so that a refusal never confirms that a record exists.',
	'unsupported-media-type':
		'Send `application/json` (or `multipart/form-data` where a file is uploaded).',
	'payload-too-large': 'The request body is larger than this endpoint accepts.',
	'rate-limited': 'Too many requests in a short time. Wait, then try again.',
	conflict: 'The request conflicts with the record’s current state; `detail` says how.',
	'intake-consent-required':
		'The client has not yet agreed that her studio records her screenings. Record her intake consent first.',
	'consent-required':
		'The client has not granted the sharing this needs (for a referral: `referral` and `screenings`).',
	'invalid-transition': 'The record cannot move to that state from the state it is in now.',
	'duplicate-referral':
		'The client already has a referral to this clinic that is sent or accepted; `openReferralId` names it. Open that one, or send `duplicateReason` to say why a second one is needed.',
	'storage-unavailable': 'Document storage did not answer. Nothing was saved; try again shortly.',
	'database-unavailable':
		'Seamwell lost its database for a moment (a restart, say). Nothing half-done was kept: a change that got this answer was not saved. Try again in a few seconds.',
	'internal-error':
		'Something went wrong on Seamwell’s side. Nothing was saved half-way. Quote the reference in `detail` to support.'
};

export const load: PageServerLoad = ({ params }) => {
	if (!Object.hasOwn(PROBLEM_TYPES, params.slug)) error(404, 'Not found');
	const slug = params.slug as ProblemSlug;
	const { status, title } = PROBLEM_TYPES[slug];
	return { slug, status, title, explanation: EXPLANATIONS[slug] };
};
