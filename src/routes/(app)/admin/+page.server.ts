import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { summariseActivity } from '$lib/server/audit/review/service';
import { summariseArea } from '$lib/server/people/service';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const [summary, activity] = await forPage(() =>
		Promise.all([summariseArea(caller, 'admin'), summariseActivity(caller, 1)])
	);
	// This week's totals over her members, for the access-log card.
	const week = { read: 0, download: 0, export: 0, refusal: 0, unusual: 0 };
	for (const member of activity.members) {
		const w = member.weeks[0]!;
		week.read += w.counts.read;
		week.download += w.counts.download;
		week.export += w.counts.export;
		week.refusal += w.counts.refusal;
		if (w.unusual) week.unusual += 1;
	}
	return { summary, week };
};
