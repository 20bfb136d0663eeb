import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { db } from '../../src/lib/server/db';
import { sessions, users } from '../../src/lib/server/db/schema';
import { deactivateMember } from '../../src/lib/server/people/service';
import {
	SESSION_ABSOLUTE_SECONDS,
	SESSION_IDLE_SECONDS,
	resolveSession,
	signInEligibility
} from '../../src/lib/server/people/sessions';
import {
	access,
	callerFor,
	logSince,
	makeOrganisation,
	makePerson,
	makeSession
} from './people-fixtures';

const sessionRow = async (token: string) =>
	(await db().select().from(sessions).where(eq(sessions.sessionToken, token)))[0];

describe('sessions', () => {
	it('the limits are 30 minutes idle and 12 hours absolute (ASVS 5.0 7.3.1, 7.3.2)', () => {
		expect(SESSION_IDLE_SECONDS).toBe(1800);
		expect(SESSION_ABSOLUTE_SECONDS).toBe(43_200);
	});

	it('an idle session (past its 30-minute deadline) ends, is deleted and logged', async () => {
		const since = new Date();
		const { userId } = await makePerson();
		const token = await makeSession(userId, { ageSeconds: 3600, idleLeftSeconds: -1 });
		const state = await resolveSession(token, { extend: true, access: access('198.51.100.7') });
		expect(state).toEqual({ state: 'ended', userId, reason: 'idle' });
		expect(await sessionRow(token)).toBeUndefined();
		const [row] = await logSince(since, userId);
		expect(row).toMatchObject({
			action: 'session.expired',
			outcome: 'refused',
			targetId: 'idle',
			clientAddress: '198.51.100.7',
			userAgent: 'people-tests/1.0'
		});
	});

	it('a busy session still ends 12 hours after sign-in', async () => {
		const since = new Date();
		const { userId } = await makePerson();
		const token = await makeSession(userId, { ageSeconds: SESSION_ABSOLUTE_SECONDS + 1 });
		const state = await resolveSession(token, { extend: true, access: access() });
		expect(state).toEqual({ state: 'ended', userId, reason: 'absolute' });
		expect(await sessionRow(token)).toBeUndefined();
		expect((await logSince(since, userId))[0]).toMatchObject({
			action: 'session.expired',
			targetId: 'absolute'
		});
	});

	it('a session just inside both limits is still active', async () => {
		const { userId } = await makePerson();
		const token = await makeSession(userId, {
			ageSeconds: SESSION_ABSOLUTE_SECONDS - 60,
			idleLeftSeconds: 30
		});
		const state = await resolveSession(token, { extend: false, access: access() });
		expect(state.state).toBe('active');
	});

	it('activity slides the idle deadline; a background refresh does not', async () => {
		const { userId } = await makePerson();
		const token = await makeSession(userId, { idleLeftSeconds: 10 * 60 });
		const before = (await sessionRow(token))!.expires.getTime();

		const background = await resolveSession(token, { extend: false, access: access() });
		expect(background).toMatchObject({ state: 'active', extended: false });
		expect((await sessionRow(token))!.expires.getTime()).toBe(before);

		const active = await resolveSession(token, { extend: true, access: access() });
		expect(active).toMatchObject({ state: 'active', extended: true });
		const after = (await sessionRow(token))!.expires.getTime();
		expect(after - Date.now()).toBeGreaterThan(29 * 60 * 1000);
		expect(after).toBeGreaterThan(before);
	});

	it('an unknown (tampered) token is simply no session', async () => {
		expect(await resolveSession('forged', { extend: true, access: access() })).toEqual({
			state: 'none'
		});
	});
});

describe('deactivation', () => {
	it('ends every session of the member at once and stops her signing in (ASVS 7.4.2)', async () => {
		const since = new Date();
		const studio = await makeOrganisation('studio');
		const admin = await makePerson([{ organisationId: studio, role: 'admin' }]);
		const member = await makePerson([{ organisationId: studio, role: 'instructor' }]);
		const first = await makeSession(member.userId);
		const second = await makeSession(member.userId);

		await deactivateMember(await callerFor(admin.userId), member.membershipIds[0]!);

		expect(await sessionRow(first)).toBeUndefined();
		expect(await sessionRow(second)).toBeUndefined();
		expect(await resolveSession(first, { extend: true, access: access() })).toEqual({
			state: 'none'
		});
		const [user] = await db().select().from(users).where(eq(users.id, member.userId));
		expect(user!.active).toBe(false);
		expect(await signInEligibility(member.email)).toEqual({
			userId: member.userId,
			eligible: false
		});
		const [row] = await logSince(since, admin.userId);
		expect(row).toMatchObject({
			action: 'member.deactivated',
			outcome: 'success',
			actorRole: 'admin',
			actorOrganisationId: studio,
			targetType: 'membership',
			targetId: member.membershipIds[0]
		});
	});

	it('an admin of another organisation cannot deactivate, and the refusal is logged', async () => {
		const since = new Date();
		const studio = await makeOrganisation('studio');
		const other = await makeOrganisation('studio');
		const outsider = await makePerson([{ organisationId: other, role: 'admin' }]);
		const member = await makePerson([{ organisationId: studio, role: 'instructor' }]);
		const token = await makeSession(member.userId);
		await expect(
			deactivateMember(await callerFor(outsider.userId), member.membershipIds[0]!)
		).rejects.toMatchObject({ slug: 'not-found' });
		expect(await sessionRow(token)).toBeDefined();
		expect((await logSince(since, outsider.userId))[0]).toMatchObject({
			action: 'access.denied',
			outcome: 'refused'
		});
	});

	it('the last admin cannot deactivate herself', async () => {
		const studio = await makeOrganisation('studio');
		const admin = await makePerson([{ organisationId: studio, role: 'admin' }]);
		await expect(
			deactivateMember(await callerFor(admin.userId), admin.membershipIds[0]!)
		).rejects.toMatchObject({ slug: 'conflict' });
	});
});
