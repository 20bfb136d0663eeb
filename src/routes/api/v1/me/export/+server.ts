import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readQuery } from '$lib/server/http/api';
import { config } from '$lib/server/config';
import { exportOwnData, ownDataBundle } from '$lib/server/privacy/export';
import type { RequestHandler } from './$types';

const exportQuery = z.strictObject({
	format: z.enum(['json', 'fhir'], { error: 'must be json or fhir' }).default('json')
});

/**
 * Everything Seamwell holds about the signed-in client, as a download: one JSON document
 * (`format=json`) or a FHIR R4 Bundle of type collection (`format=fhir`).
 */
export const GET: RequestHandler = apiHandler(async ({ locals, url }) => {
	const caller = requireApiCaller(locals);
	const { format } = readQuery(url, exportQuery);
	const data = await exportOwnData(caller);
	const day = data.exportedAt.slice(0, 10);
	if (format === 'fhir') {
		const bundle = ownDataBundle(data, config().ORIGIN);
		return new Response(JSON.stringify(bundle), {
			headers: {
				'Content-Type': 'application/fhir+json; charset=utf-8',
				'Content-Disposition': `attachment; filename="seamwell-my-data-${day}.fhir.json"`,
				'Cache-Control': 'no-store'
			}
		});
	}
	return json(data, {
		headers: {
			'Content-Disposition': `attachment; filename="seamwell-my-data-${day}.json"`,
			'Cache-Control': 'no-store'
		}
	});
});
