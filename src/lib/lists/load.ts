import { error, redirect } from '@sveltejs/kit';

// Every list page in Seamwell loads the same way: its `+page.ts` asks the JSON API for the page
// the address names — on the server for the first render (it works without JavaScript), in the
// browser when filters change. Filters live in the address (a GET form); further pages come
// from the same API with the cursor the last one returned (see `more.svelte.ts`).

export interface FieldProblem {
	pointer: string;
	message: string;
}

export interface ListPage<T> {
	items: T[];
	nextCursor: string | null;
	/** A plain note for the person, e.g. that filters from an edited link were left out. */
	note: string | null;
	/** Filters the API refused (`report` lists only), to show beside their fields. */
	errors: FieldProblem[];
	/** The API query these items answer, without the cursor: further pages add theirs. */
	query: string;
	/** The cursor this page starts at (null: the first page). */
	cursor: string | null;
}

export interface ListSource {
	/** The JSON list endpoint, e.g. `/api/v1/clients`. */
	api: string;
	/** The address parameters the API takes; a repeated one (checkboxes) goes comma-separated. */
	keys: readonly string[];
	/**
	 * What a refused filter does. `drop`: show the list without it, with a plain note (a filter
	 * the person cannot choose on the page, so it came from an edited or old link). `report`:
	 * show no rows and the API's words beside the field (a filter the person typed).
	 */
	invalid: 'drop' | 'report';
}

const DROPPED_NOTE =
	'Some filters in the address were not ones this list knows, so they are left out.';

/** The API query for the list the address shows (cursor included). */
export function apiParams(url: URL, keys: readonly string[]): URLSearchParams {
	const params = new URLSearchParams();
	for (const key of keys) {
		const values = url.searchParams.getAll(key).filter(Boolean);
		if (values.length) params.set(key, values.join(','));
	}
	return params;
}

type Fetch = typeof fetch;

export async function loadListPage<T>(
	fetch: Fetch,
	url: URL,
	source: ListSource
): Promise<ListPage<T>> {
	const params = apiParams(url, source.keys);
	let response = await fetch(`${source.api}?${params}`);
	if (response.status === 401) {
		redirect(303, `/signin?callbackUrl=${encodeURIComponent(url.pathname + url.search)}`);
	}
	// A list this person has no part in is not there for her (the API has logged the refusal).
	if (response.status === 403) error(404, 'Not found');
	let body = await response.json();
	let note: string | null = null;
	let errors: FieldProblem[] = [];
	if (response.status === 422 && Array.isArray(body.errors)) {
		errors = body.errors as FieldProblem[];
		if (source.invalid === 'report')
			return { items: [], nextCursor: null, note, errors, query: '', cursor: null };
		for (const { pointer } of errors) params.delete(pointer.replace(/^\//, ''));
		response = await fetch(`${source.api}?${params}`);
		body = await response.json();
		note = DROPPED_NOTE;
		errors = [];
	}
	if (!response.ok) {
		error(response.status === 422 ? 400 : response.status, body.detail ?? 'Not available');
	}
	const cursor = params.get('cursor');
	params.delete('cursor');
	return {
		items: body.items as T[],
		nextCursor: (body.nextCursor as string | null) ?? null,
		note,
		errors,
		query: params.toString(),
		cursor
	};
}
