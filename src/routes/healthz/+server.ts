import { json } from '@sveltejs/kit';
import { checkHealth } from '$lib/server/health';
import type { RequestHandler } from './$types';

// Liveness and dependency health for scripts and operators: 200 when every service answers.
export const GET: RequestHandler = async () => {
	const health = await checkHealth();
	return json(health, {
		status: health.ok ? 200 : 503,
		headers: { 'Cache-Control': 'no-store' }
	});
};
