import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { listFailedMailFor, resendFailedMail } from '$lib/server/mail/service';
import { failFromProblem } from '$lib/server/http/form';
import { summariseActivity } from '$lib/server/audit/review/service';
import { summariseArea } from '$lib/server/people/service';
import { erasureRequestCounts } from '$lib/server/privacy/erasure';
import type { Actions, PageServerLoad } from './$types';
import { studioAdminIds } from '$lib/server/scope';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const [summary, failedMail, activity] = await Promise.all([
		forPage(summariseArea(caller, 'admin')),
		forPage(listFailedMailFor(caller)),
		forPage(summariseActivity(caller, 1))
	]);
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
	// Requests to erase data are answered by the studio that holds the record.
	const dataRequests = studioAdminIds(caller.actor).length
		? await erasureRequestCounts(caller)
		: null;
	return { summary, failedMail, week, dataRequests };
};

const resendForm = z.object({ mailId: z.uuid('Unknown mail.') });

export const actions: Actions = {
	// Admins only (the service asserts it); recorded in the access log as mail.resent.
	resend: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		const values = { mailId: String((await request.formData()).get('mailId') ?? '').slice(0, 100) };
		const parsed = resendForm.safeParse(values);
		if (!parsed.success) {
			return fail(400, { values, errors: { form: 'Choose a mail to send again.' } });
		}
		try {
			await resendFailedMail(caller, parsed.data.mailId);
		} catch (e) {
			return failFromProblem(e, values);
		}
		return { resent: parsed.data.mailId };
	}
};
