import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readQuery } from '$lib/server/http/api';
import { summariseActivity } from '$lib/server/audit/review/service';
import type { RequestHandler } from './$types';

const summaryQuery = z.object({
	weeks: z.preprocess(
		(v) => (v === '' ? undefined : v),
		z.coerce
			.number('must be a number')
			.int('must be a whole number')
			.min(1, 'must be 1 to 12')
			.max(12, 'must be 1 to 12')
			.default(4)
	)
});

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const { weeks } = readQuery(event.url, summaryQuery);
	return json(await summariseActivity(caller, weeks));
});
