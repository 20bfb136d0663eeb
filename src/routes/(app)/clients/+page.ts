import { loadListPage } from '$lib/lists/load';
import type { ClientSummary } from '$lib/clients/types';
import type { PageLoad } from './$types';

// Client records are for instructors: to anyone else the list is not there (404). A filter the
// page does not offer (an edited or old link) is left out with a plain note.
export const load: PageLoad = async ({ fetch, url }) => ({
	list: await loadListPage<ClientSummary>(fetch, url, {
		api: '/api/v1/clients',
		keys: ['search', 'needs', 'sort', 'limit', 'cursor'],
		invalid: 'drop'
	})
});
