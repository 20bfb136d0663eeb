import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readQuery } from '$lib/server/http/api';
import { reviewQuery } from '$lib/server/audit/review/filters';
import { exportAccessEvents, listAccessEvents } from '$lib/server/audit/review/service';
import type { RequestHandler } from './$types';

const formatQuery = z.object({
	format: z.preprocess((v) => (v === '' ? undefined : v), z.enum(['json', 'csv']).default('json'))
});

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const { format } = readQuery(event.url, formatQuery);
	const query = readQuery(event.url, reviewQuery);
	if (format === 'json') return json(await listAccessEvents(caller, query));
	const { filename, stream } = await exportAccessEvents(caller, query);
	return new Response(stream, {
		headers: {
			'Content-Type': 'text/csv; charset=utf-8',
			'Content-Disposition': `attachment; filename="${filename}"`,
			'Cache-Control': 'no-store'
		}
	});
});
