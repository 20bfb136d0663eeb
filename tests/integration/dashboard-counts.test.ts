import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { screeningInputSchema } from '../../src/lib/clients/schemas';
import { countClients, listClients, recordScreening } from '../../src/lib/server/clients/service';
import { countOwnSharing } from '../../src/lib/server/consents/service';
import { db } from '../../src/lib/server/db';
import { consentRequests, referrals } from '../../src/lib/server/db/schema';
import { countReferrals, listReferrals } from '../../src/lib/server/referrals/service';
import {
	addConsent,
	addReferral,
	logRows,
	makeClient,
	makeMember,
	makeOrg,
	statusOf
} from '../support/referral-fixtures';

// The dashboards' numbers: each agrees with the list it links to, and counting leaves no
// access-log row (a number names no client; the list logs each one it shows).

const WEEK_MS = 7 * 86_400_000;
const site = (widthFingers: number) => ({
	widthFingers,
	depth: 'shallow',
	tension: 'firm',
	doming: false
});
const screening = (weeksAgo: number, atNavel: number) =>
	screeningInputSchema.parse({
		takenAt: new Date(Date.now() - weeksAgo * WEEK_MS).toISOString(),
		sites: { above_navel: site(1), at_navel: site(atNavel), below_navel: site(1) },
		redFlags: []
	});

describe('countClients', () => {
	it('counts her studio’s clients to refer and to screen, as the filtered lists show them', async () => {
		const studio = await makeOrg('studio');
		const instructor = await makeMember(studio, 'instructor');
		const refer = await makeClient(studio, 'refer');
		const overdue = await makeClient(studio, 'overdue');
		await makeClient(studio, 'never');
		// A client of another studio is never counted.
		await makeClient(await makeOrg('studio'), 'elsewhere');
		// Sperstad JB et al. 2016: 2 finger widths or more refers; 1 does not.
		await recordScreening(instructor.caller, refer.clientId, screening(1, 2));
		// Our own 8-week rule (SCREENING_DUE_WEEKS, common practice, no source): 9 weeks is due.
		await recordScreening(instructor.caller, overdue.clientId, screening(9, 1));
		const logged = (await logRows(instructor.userId)).length;

		const counts = await countClients(instructor.caller);
		expect(counts).toEqual({ total: 3, needsReferral: 1, needsScreening: 2 });
		expect((await logRows(instructor.userId)).length).toBe(logged);

		const list = (needs?: 'referral' | 'screening') =>
			listClients(instructor.caller, { needs, sort: 'name', limit: 50 });
		expect((await list('referral')).items.map((c) => c.id)).toEqual([refer.clientId]);
		expect((await list('screening')).items).toHaveLength(counts.needsScreening);
		expect((await list()).items).toHaveLength(counts.total);
	});

	it('is refused to someone who teaches in no studio', async () => {
		const physio = await makeMember(await makeOrg('clinic'), 'physiotherapist');
		expect(await statusOf(countClients(physio.caller))).toBe(403);
	});
});

describe('countReferrals', () => {
	it('counts by state with the list’s visibility, and answers only of the last 14 days', async () => {
		const studio = await makeOrg('studio');
		const clinic = await makeOrg('clinic');
		const instructor = await makeMember(studio, 'instructor');
		const physio = await makeMember(clinic, 'physiotherapist');
		const client = await makeClient(studio);
		const add = (state: 'draft' | 'sent' | 'accepted' | 'declined' | 'withdrawn') =>
			addReferral({
				clientId: client.clientId,
				studio,
				clinic,
				createdBy: instructor.userId,
				state
			});
		await add('draft');
		await add('sent');
		await add('sent');
		await add('accepted');
		const oldAccepted = await add('accepted');
		const oldDeclined = await add('declined');
		await add('withdrawn');
		const longAgo = new Date(Date.now() - 20 * 86_400_000);
		for (const id of [oldAccepted, oldDeclined]) {
			await db().update(referrals).set({ updatedAt: longAgo }).where(eq(referrals.id, id));
		}
		const logged = (await logRows(instructor.userId)).length;

		const studioSide = await countReferrals(instructor.caller);
		expect(studioSide.byState).toMatchObject({
			draft: 1,
			sent: 2,
			accepted: 2,
			declined: 1,
			withdrawn: 1,
			assessed: 0,
			closed: 0
		});
		expect(studioSide.acceptedRecently).toBe(1);
		expect(studioSide.declinedRecently).toBe(0);
		expect((await logRows(instructor.userId)).length).toBe(logged);

		// The clinic never sees a draft.
		const clinicSide = await countReferrals(physio.caller);
		expect(clinicSide.byState.draft).toBe(0);
		expect(clinicSide.byState.sent).toBe(2);
		const inbox = await listReferrals(physio.caller, { state: ['sent'], sort: 'date', limit: 25 });
		expect(inbox.items).toHaveLength(clinicSide.byState.sent);
	});

	it('is refused to a client', async () => {
		const client = await makeClient(await makeOrg('studio'));
		expect(await statusOf(countReferrals(client.caller))).toBe(403);
	});
});

describe('countOwnSharing', () => {
	it('counts her grants in force and the requests she has not answered', async () => {
		const studio = await makeOrg('studio');
		const [sharing, withdrawn, asked] = await Promise.all([
			makeOrg('clinic'),
			makeOrg('clinic'),
			makeOrg('clinic')
		]);
		const client = await makeClient(studio);
		await addConsent(client, studio, sharing);
		await addConsent(client, studio, withdrawn, undefined, { withdrawnAt: new Date() });
		// A request for the clinic she already shares with is no longer open.
		await db()
			.insert(consentRequests)
			.values([
				{ clientId: client.clientId, clinicId: asked.id },
				{ clientId: client.clientId, clinicId: sharing.id }
			]);
		const logged = (await logRows(client.userId)).length;
		expect(await countOwnSharing(client.caller)).toEqual({ activeGrants: 1, openRequests: 1 });
		expect((await logRows(client.userId)).length).toBe(logged);
	});

	it('is refused to someone with no client record', async () => {
		const instructor = await makeMember(await makeOrg('studio'), 'instructor');
		expect(await statusOf(countOwnSharing(instructor.caller))).toBe(403);
	});
});
