import type { RequestEvent } from '@sveltejs/kit';
import { and, eq, gt, sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { requestSignInLink } from '../../src/lib/server/auth';
import { db } from '../../src/lib/server/db';
import { outbox, rateLimitHits, verificationTokens } from '../../src/lib/server/db/schema';
import { consumeSignInAllowance } from '../../src/lib/server/people/rate-limit';
import { inspectSignInLink } from '../../src/lib/server/people/sessions';
import { access, logSince, makeOrganisation, makePerson } from './people-fixtures';

/** What requestSignInLink reads from a request: its origin and the access context. */
function requestFrom(address: string): RequestEvent {
	return {
		url: new URL(process.env.ORIGIN ?? 'http://127.0.0.1:3010'),
		locals: { actor: null, access: access(address) }
	} as unknown as RequestEvent;
}

const uniqueIp = () => `203.0.113.${Math.floor(Math.random() * 250) + 1}`;

async function mailsTo(address: string, since: Date) {
	return db()
		.select()
		.from(outbox)
		.where(and(eq(outbox.to, address), gt(outbox.createdAt, since)));
}

describe('asking for a sign-in link', () => {
	it('an active person gets one link mail, to the confirmation page, valid 10 minutes', async () => {
		const since = new Date(Date.now() - 1000);
		const org = await makeOrganisation('clinic');
		const person = await makePerson([{ organisationId: org, role: 'physiotherapist' }]);
		const outcome = await requestSignInLink(requestFrom(uniqueIp()), person.email, '/start');
		expect(outcome).toBe('sent');
		const mails = await mailsTo(person.email, since);
		expect(mails).toHaveLength(1);
		expect(mails[0]!.kind).toBe('signin.link');
		const link = mails[0]!.text.match(/https?:\/\/\S+\/signin\/confirm\?\S+/)?.[0];
		expect(link).toBeTruthy();
		const url = new URL(link!);
		expect(url.searchParams.get('email')).toBe(person.email);
		expect(await inspectSignInLink(person.email, url.searchParams.get('token')!)).toBe('valid');
		const [token] = await db()
			.select()
			.from(verificationTokens)
			.where(eq(verificationTokens.identifier, person.email));
		const lifetime = token!.expires.getTime() - Date.now();
		expect(lifetime).toBeGreaterThan(9 * 60 * 1000);
		expect(lifetime).toBeLessThanOrEqual(10 * 60 * 1000);
		const [row] = await logSince(since, person.userId);
		expect(row).toMatchObject({ action: 'signin.requested', outcome: 'success' });
	});

	it('a new link revokes her earlier unused ones; an unsent earlier link mail is not sent', async () => {
		const since = new Date(Date.now() - 1000);
		const org = await makeOrganisation('studio');
		const person = await makePerson([{ organisationId: org, role: 'instructor' }]);
		const ip = uniqueIp();
		for (let i = 0; i < 3; i++) {
			expect(await requestSignInLink(requestFrom(ip), person.email, '/start')).toBe('sent');
		}
		const mails = (await mailsTo(person.email, since)).sort(
			(a, b) => a.createdAt.getTime() - b.createdAt.getTime()
		);
		expect(mails).toHaveLength(3);
		const tokenOf = (text: string) =>
			new URL(text.match(/https?:\/\/\S+\/signin\/confirm\?\S+/)![0]).searchParams.get('token')!;
		const states = await Promise.all(
			mails.map((m) => inspectSignInLink(person.email, tokenOf(m.text)))
		);
		expect(states).toEqual(['invalid', 'invalid', 'valid']);
		const tokens = await db()
			.select()
			.from(verificationTokens)
			.where(eq(verificationTokens.identifier, person.email));
		expect(tokens).toHaveLength(1);
		// No worker runs in these tests, so the earlier mails were still waiting: not to be sent.
		expect(mails.map((m) => m.state)).toEqual(['superseded', 'superseded', 'pending']);
	});

	it('an unknown or deactivated address gets no mail, no token, the same answer, logged as refused', async () => {
		const since = new Date(Date.now() - 1000);
		const unknown = `nobody-${Date.now()}@test.example`;
		const gone = await makePerson();
		await db().execute(sql`update users set active = false where id = ${gone.userId}`);
		const startedUnknown = Date.now();
		expect(await requestSignInLink(requestFrom(uniqueIp()), unknown, '/start')).toBe('sent');
		const unknownMs = Date.now() - startedUnknown;
		expect(await requestSignInLink(requestFrom(uniqueIp()), gone.email, '/start')).toBe('sent');
		expect(await mailsTo(unknown, since)).toHaveLength(0);
		expect(await mailsTo(gone.email, since)).toHaveLength(0);
		const tokens = await db()
			.select()
			.from(verificationTokens)
			.where(eq(verificationTokens.identifier, gone.email));
		expect(tokens).toHaveLength(0);
		// Both answers take at least the fixed floor, so timing does not tell them apart.
		expect(unknownMs).toBeGreaterThanOrEqual(390);
		const rows = await logSince(since);
		expect(rows.find((r) => r.actorUserId === gone.userId)).toMatchObject({
			action: 'signin.refused',
			outcome: 'refused',
			userAgent: 'people-tests/1.0'
		});
	});
});

describe('sign-in rate limit', () => {
	it('refuses past the per-address limit, and the window moves on', async () => {
		const email = `limited-${Date.now()}@test.example`;
		const ip = uniqueIp();
		const limits = { perEmail: 3, perAddress: 100 };
		for (let i = 0; i < 3; i++) {
			expect(await consumeSignInAllowance(email, ip, limits)).toEqual({ allowed: true });
		}
		expect(await consumeSignInAllowance(email, ip, limits)).toEqual({
			allowed: false,
			bucket: 'signin.email'
		});
		// Move the clock: the earlier requests are now 16 minutes old.
		await db()
			.update(rateLimitHits)
			.set({ at: sql`now() - interval '16 minutes'` })
			.where(eq(rateLimitHits.key, email));
		expect(await consumeSignInAllowance(email, ip, limits)).toEqual({ allowed: true });
	});

	it('refuses past the per-client-address limit, whatever the e-mail', async () => {
		const ip = uniqueIp() + '-x';
		const limits = { perEmail: 100, perAddress: 2 };
		expect(await consumeSignInAllowance(`a-${Date.now()}@t.example`, ip, limits)).toEqual({
			allowed: true
		});
		expect(await consumeSignInAllowance(`b-${Date.now()}@t.example`, ip, limits)).toEqual({
			allowed: true
		});
		expect(await consumeSignInAllowance(`c-${Date.now()}@t.example`, ip, limits)).toEqual({
			allowed: false,
			bucket: 'signin.ip'
		});
	});

	it('concurrent requests share one count (as two app processes would)', async () => {
		const email = `burst-${Date.now()}@test.example`;
		const limits = { perEmail: 5, perAddress: 1000 };
		const results = await Promise.all(
			Array.from({ length: 12 }, () => consumeSignInAllowance(email, uniqueIp(), limits))
		);
		expect(results.filter((r) => r.allowed)).toHaveLength(5);
	});

	it('a refused request through the sign-in path is logged with the bucket, and no mail goes out', async () => {
		const since = new Date(Date.now() - 1000);
		const org = await makeOrganisation('studio');
		const person = await makePerson([{ organisationId: org, role: 'instructor' }]);
		const ip = uniqueIp();
		// The default limit is 5 per address in 15 minutes.
		for (let i = 0; i < 5; i++) await consumeSignInAllowance(person.email, ip);
		expect(await requestSignInLink(requestFrom(ip), person.email, '/start')).toBe('limited');
		expect(await mailsTo(person.email, since)).toHaveLength(0);
		expect((await logSince(since, person.userId))[0]).toMatchObject({
			action: 'signin.refused',
			outcome: 'refused',
			targetType: 'rate_limit',
			targetId: 'signin.email',
			clientAddress: ip
		});
	});
});
