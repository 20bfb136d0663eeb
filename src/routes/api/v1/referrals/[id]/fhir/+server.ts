import { requireApiCaller } from '$lib/server/context';
import { config } from '$lib/server/config';
import { getDocumentPanel } from '$lib/server/documents/service';
import { apiHandler, readId } from '$lib/server/http/api';
import { buildReferralBundle } from '$lib/server/privacy/fhir';
import { getReferral } from '$lib/server/referrals/service';
import type { RequestHandler } from './$types';

/**
 * One referral as a FHIR R4 Bundle, for the clinic's own record system: the same policy as the
 * referral page (404 for anyone who may not see it), the same documents the reader may download.
 */
export const GET: RequestHandler = apiHandler(async ({ locals, params }) => {
	const caller = requireApiCaller(locals);
	const id = readId(params.id);
	const referral = await getReferral(caller, id);
	// The referral page's own documents panel: the studio sees none without `documents` consent.
	const documents = await getDocumentPanel(caller, id);
	const bundle = buildReferralBundle(referral, documents.items, config().ORIGIN);
	return new Response(JSON.stringify(bundle), {
		headers: {
			'Content-Type': 'application/fhir+json; charset=utf-8',
			'Content-Disposition': `attachment; filename="referral-${id}.fhir.json"`,
			'Cache-Control': 'no-store'
		}
	});
});
