import { error, redirect } from '@sveltejs/kit';
import type { ClientSummary } from '$lib/clients/types';
import type { PageLoad } from './$types';

// The list comes from the JSON API: on the server for the first page, in the browser when the
// filters or the page change. Filters and cursor stay in the URL.
export const load: PageLoad = async ({ fetch, url }) => {
	const params = new URLSearchParams();
	for (const key of ['search', 'needs', 'sort', 'cursor']) {
		const value = url.searchParams.get(key);
		if (value) params.set(key, value);
	}
	const response = await fetch(`/api/v1/clients?${params}`);
	if (response.status === 401) {
		redirect(303, `/signin?callbackUrl=${encodeURIComponent(url.pathname + url.search)}`);
	}
	// Client records are for instructors: to anyone else the list is not there.
	if (response.status === 403) error(404, 'Not found');
	const body = await response.json();
	if (!response.ok) {
		error(response.status === 422 ? 400 : response.status, body.detail ?? 'Not available');
	}
	return {
		items: body.items as ClientSummary[],
		nextCursor: body.nextCursor as string | null
	};
};
