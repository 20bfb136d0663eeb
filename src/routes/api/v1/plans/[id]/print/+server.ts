import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireApiCaller } from '$lib/server/context';
import { apiHandler, readId, readJson } from '$lib/server/http/api';
import { recordPrint } from '$lib/server/plans/service';
import type { RequestHandler } from './$types';

/** Records that the class sheet was printed (the browser calls it before opening print). */
export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = requireApiCaller(event.locals);
	const id = readId(event.params.id);
	await readJson(event, z.strictObject({}));
	await recordPrint(caller, id);
	return json({ recorded: true });
});
