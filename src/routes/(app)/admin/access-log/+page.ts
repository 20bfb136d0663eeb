import { loadListPage } from '$lib/lists/load';
import type { AccessEventItem } from '$lib/server/audit/review/service';
import type { PageLoad } from './$types';

// The events, from the JSON API like every list page's. A filter the admin typed that the log
// cannot read (a "from" after "to") is reported beside its field, with no rows.
export const load: PageLoad = async ({ fetch, url, data }) => ({
	...data,
	list: await loadListPage<AccessEventItem>(fetch, url, {
		api: '/api/v1/audit',
		keys: ['actor', 'client', 'action', 'outcome', 'target', 'from', 'to', 'limit', 'cursor'],
		invalid: 'report'
	})
});
