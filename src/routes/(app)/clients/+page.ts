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
	let response = await fetch(`/api/v1/clients?${params}`);
	if (response.status === 401) {
		redirect(303, `/signin?callbackUrl=${encodeURIComponent(url.pathname + url.search)}`);
	}
	// Client records are for instructors: to anyone else the list is not there.
	if (response.status === 403) error(404, 'Not found');
	let body = await response.json();
	// A filter in the address that the list does not know (an edited or old link): show the
	// list without it and say so, rather than an error page of field pointers.
	let note: string | null = null;
	if (response.status === 422 && Array.isArray(body.errors)) {
		for (const { pointer } of body.errors as Array<{ pointer: string }>) {
			params.delete(pointer.replace(/^\//, ''));
		}
		response = await fetch(`/api/v1/clients?${params}`);
		body = await response.json();
		note = 'Some filters in the address were not ones this list knows, so they are left out.';
	}
	if (!response.ok) {
		error(response.status === 422 ? 400 : response.status, body.detail ?? 'Not available');
	}
	return {
		items: body.items as ClientSummary[],
		nextCursor: body.nextCursor as string | null,
		note
	};
};
