import { requirePageCaller } from '$lib/server/context';
import { notHere } from '$lib/server/referrals/not-here';
import type { PageServerLoad } from './$types';
import { instructorStudioIds, physioClinicIds } from '$lib/server/scope';

// Which parts of the page this person has; the list itself is loaded by `+page.ts` from
// /api/v1/referrals, like every list page's.
export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const { actor } = caller;
	const canRefer = instructorStudioIds(actor).length > 0;
	const canReceive = physioClinicIds(actor).length > 0;
	if (!canRefer && !canReceive) {
		await notHere(caller, 'referral.listed', { type: 'route', id: '/(app)/referrals' });
	}
	return { canRefer, canReceive };
};
