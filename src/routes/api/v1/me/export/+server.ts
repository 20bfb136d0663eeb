import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readQuery } from '$lib/server/http/api';
import { exportOwnData } from '$lib/server/privacy/export';
import type { RequestHandler } from './$types';

const exportQuery = z.strictObject({
	format: z.enum(['json'], { error: 'must be json' }).default('json')
});

/** Everything Seamwell holds about the signed-in client, as one JSON document (a download). */
export const GET: RequestHandler = apiHandler(async ({ locals, url }) => {
	const caller = requireApiCaller(locals);
	readQuery(url, exportQuery);
	const data = await exportOwnData(caller);
	const day = data.exportedAt.slice(0, 10);
	return json(data, {
		headers: {
			'Content-Disposition': `attachment; filename="seamwell-my-data-${day}.json"`,
			'Cache-Control': 'no-store'
		}
	});
});
