import type { ListPage } from './load';

// The rows a list page shows: the page its load returned, then any further pages the person
// asked for, appended in place from the same API with the same filters. A new load (other
// filters, another address) starts over from its own page. Without JavaScript the "more" link
// is an ordinary link to the next cursor, which the load serves.

interface View<T> {
	/** The loaded page these rows grew from; a different one means the address changed. */
	from: ListPage<T>;
	items: T[];
	nextCursor: string | null;
	pages: number;
}

export class MoreItems<T> {
	#page: () => ListPage<T>;
	#api: string;
	#view = $state.raw<View<T> | null>(null);

	loading = $state(false);
	problem = $state<string | null>(null);

	constructor(page: () => ListPage<T>, api: string) {
		this.#page = page;
		this.#api = api;
	}

	#current = $derived.by((): View<T> => {
		const page = this.#page();
		const view = this.#view;
		if (view && view.from === page) return view;
		return { from: page, items: page.items, nextCursor: page.nextCursor, pages: 1 };
	});

	get items(): T[] {
		return this.#current.items;
	}

	get nextCursor(): string | null {
		return this.#current.nextCursor;
	}

	#url(query: string, cursor: string | null): string {
		const cursorPart = cursor ? `cursor=${encodeURIComponent(cursor)}` : '';
		return `${this.#api}?${[query, cursorPart].filter(Boolean).join('&')}`;
	}

	async #fetch(
		url: string,
		init?: RequestInit
	): Promise<{ items: T[]; nextCursor: string | null } | null> {
		try {
			const response = await fetch(url, init);
			if (response.status === 401) {
				this.problem = 'You have been signed out. Sign in again to see more.';
				return null;
			}
			const body = await response.json();
			if (!response.ok) {
				this.problem = body.detail ?? 'The list could not be loaded.';
				return null;
			}
			this.problem = null;
			return { items: body.items, nextCursor: body.nextCursor ?? null };
		} catch {
			this.problem = 'The list could not be loaded. Check your connection and try again.';
			return null;
		}
	}

	/** Appends the next page in place; the link's own address is the no-JavaScript path. */
	async more(event?: Event): Promise<void> {
		const view = this.#current;
		if (!view.nextCursor) return;
		event?.preventDefault();
		if (this.loading) return;
		this.loading = true;
		try {
			const next = await this.#fetch(this.#url(view.from.query, view.nextCursor));
			if (next && this.#current === view) {
				this.#view = {
					from: view.from,
					items: [...view.items, ...next.items],
					nextCursor: next.nextCursor,
					pages: view.pages + 1
				};
			}
		} finally {
			this.loading = false;
		}
	}

	/**
	 * Reads the shown page again (e.g. a list that keeps itself current). Skipped while the
	 * person has appended further pages: replacing them under her would lose her place.
	 * Returns whether the rows were refreshed.
	 */
	async refresh(init?: RequestInit): Promise<boolean> {
		const view = this.#current;
		if (view.pages > 1) return false;
		const fresh = await this.#fetch(this.#url(view.from.query, view.from.cursor), init);
		if (!fresh || this.#current !== view) return false;
		this.#view = { from: view.from, ...fresh, pages: 1 };
		return true;
	}
}
