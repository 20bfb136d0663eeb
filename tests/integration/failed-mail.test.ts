import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { db } from '../../src/lib/server/db';
import { outbox } from '../../src/lib/server/db/schema';
import { ProblemError } from '../../src/lib/server/http/problem';
import { listFailedMailFor, resendFailedMail } from '../../src/lib/server/mail/service';
import { callerFor, logSince, makeOrganisation, makePerson } from './people-fixtures';

// Mail that failed for its whole retry window: listed for the admins of the people it was for,
// and sent again by them — admins only, their own organisation's mail only, logged.

async function failedMail(to: string, kind = 'invitation'): Promise<string> {
	const [row] = await db()
		.insert(outbox)
		.values({
			to,
			kind,
			subject: 'Something',
			text: 'Body that no list shows',
			state: 'failed',
			attempts: 190,
			lastError: 'connect ECONNREFUSED 127.0.0.1:25'
		})
		.returning({ id: outbox.id });
	return row!.id;
}

describe('failed mail on the admin dashboard', () => {
	it('lists her organisation’s failed mail only, and sends it again (logged)', async () => {
		const studio = await makeOrganisation('studio');
		const admin = await makePerson([{ organisationId: studio, role: 'admin' }]);
		const member = await makePerson([{ organisationId: studio, role: 'instructor' }]);
		const stranger = `stranger-${randomUUID().slice(0, 8)}@test.example`;
		const mine = await failedMail(member.email);
		const link = await failedMail(member.email, 'signin.link');
		const theirs = await failedMail(stranger);
		const caller = await callerFor(admin.userId, studio);

		const listed = await listFailedMailFor(caller);
		expect(listed.map((m) => m.id).sort()).toEqual([mine, link].sort());
		expect(listed.find((m) => m.id === mine)).toMatchObject({
			to: member.email,
			kind: 'invitation',
			resendable: true
		});
		expect(listed.find((m) => m.id === link)!.resendable).toBe(false);
		expect(JSON.stringify(listed)).not.toContain('Body that no list shows');

		const since = new Date(Date.now() - 1000);
		await resendFailedMail(caller, mine);
		const [row] = await db().select().from(outbox).where(eq(outbox.id, mine));
		expect(row).toMatchObject({ state: 'pending', attempts: 0, lastError: null });
		expect(row!.retryFrom.getTime()).toBeGreaterThan(since.getTime());
		const [logged] = await logSince(since, admin.userId);
		expect(logged).toMatchObject({ action: 'mail.resent', outcome: 'success', targetId: mine });

		// Another organisation's mail, a sign-in link, or one not failed: 404, recorded.
		for (const id of [theirs, link, mine]) {
			await expect(resendFailedMail(caller, id)).rejects.toBeInstanceOf(ProblemError);
		}
		const refused = (await logSince(since, admin.userId)).filter((r) => r.outcome === 'refused');
		expect(refused).toHaveLength(3);
	});

	it('is for admins only', async () => {
		const studio = await makeOrganisation('studio');
		const instructor = await makePerson([{ organisationId: studio, role: 'instructor' }]);
		const id = await failedMail(instructor.email);
		const caller = await callerFor(instructor.userId, studio);
		await expect(listFailedMailFor(caller)).rejects.toBeInstanceOf(ProblemError);
		await expect(resendFailedMail(caller, id)).rejects.toBeInstanceOf(ProblemError);
		const [row] = await db().select().from(outbox).where(eq(outbox.id, id));
		expect(row!.state).toBe('failed');
	});
});
