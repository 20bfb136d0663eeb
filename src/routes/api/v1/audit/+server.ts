import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readQuery } from '$lib/server/http/api';
import { reviewQuery } from '$lib/server/audit/review/filters';
import { auditBundle } from '$lib/server/audit/review/fhir';
import { config } from '$lib/server/config';
import { exportAccessEvents, listAccessEvents } from '$lib/server/audit/review/service';
import type { RequestHandler } from './$types';

const formatQuery = z.object({
	format: z.preprocess(
		(v) => (v === '' ? undefined : v),
		z.enum(['json', 'csv', 'fhir']).default('json')
	)
});

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const { format } = readQuery(event.url, formatQuery);
	const query = readQuery(event.url, reviewQuery);
	if (format === 'json') return json(await listAccessEvents(caller, query));
	if (format === 'fhir') {
		const page = await listAccessEvents(caller, query);
		const next = page.nextCursor ? new URL(event.url) : null;
		next?.searchParams.set('cursor', page.nextCursor!);
		const origin = config().ORIGIN;
		return new Response(
			JSON.stringify(
				auditBundle(page.items, origin, next && `${origin}${next.pathname}${next.search}`)
			),
			{
				headers: {
					'Content-Type': 'application/fhir+json; charset=utf-8',
					'Cache-Control': 'no-store'
				}
			}
		);
	}
	const { filename, stream } = await exportAccessEvents(caller, query);
	return new Response(stream, {
		headers: {
			'Content-Type': 'text/csv; charset=utf-8',
			'Content-Disposition': `attachment; filename="${filename}"`,
			'Cache-Control': 'no-store'
		}
	});
});
