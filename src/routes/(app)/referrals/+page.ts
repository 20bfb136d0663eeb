import { loadListPage, type ListPage } from '$lib/lists/load';
import type { ReferralListItem } from '$lib/referrals/types';
import type { PageLoad } from './$types';

// The server load says which parts of the page this person has (and logs a refusal for anyone
// with none); the list itself comes from the JSON API like every list page's.
export const load: PageLoad = async ({ fetch, url, data }) => {
	const list: ListPage<ReferralListItem> | null =
		data.canRefer || data.canReceive
			? await loadListPage<ReferralListItem>(fetch, url, {
					api: '/api/v1/referrals',
					keys: ['state', 'sort', 'q', 'limit', 'cursor'],
					invalid: 'drop'
				})
			: null;
	return { ...data, list };
};
