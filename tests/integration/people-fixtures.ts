// Small builders for the people tests: an organisation, a person with memberships, a session.
import { randomBytes, randomUUID } from 'node:crypto';
import { and, desc, eq, gte } from 'drizzle-orm';
import type { MemberRole } from '../../src/lib/server/actor';
import type { AccessContext } from '../../src/lib/server/audit';
import type { Caller } from '../../src/lib/server/context';
import { db } from '../../src/lib/server/db';
import {
	accessLog,
	memberships,
	organisations,
	sessions,
	users
} from '../../src/lib/server/db/schema';
import { loadActor } from '../../src/lib/server/people/sessions';

export const access = (address = '192.0.2.10'): AccessContext => ({
	userId: null,
	role: null,
	organisationId: null,
	address,
	userAgent: 'people-tests/1.0'
});

export async function makeOrganisation(kind: 'studio' | 'clinic' = 'studio'): Promise<string> {
	const [row] = await db()
		.insert(organisations)
		.values({ name: `Test ${kind} ${randomUUID().slice(0, 6)}`, kind })
		.returning({ id: organisations.id });
	return row!.id;
}

export async function makePerson(
	roles: Array<{ organisationId: string; role: MemberRole }> = [],
	email = `person-${randomUUID().slice(0, 8)}@test.example`
): Promise<{ userId: string; email: string; membershipIds: string[] }> {
	const [user] = await db()
		.insert(users)
		.values({ email, name: `Test ${email.split('@')[0]}` })
		.returning({ id: users.id });
	const membershipIds: string[] = [];
	for (const r of roles) {
		const [m] = await db()
			.insert(memberships)
			.values({ userId: user!.id, organisationId: r.organisationId, role: r.role })
			.returning({ id: memberships.id });
		membershipIds.push(m!.id);
	}
	return { userId: user!.id, email, membershipIds };
}

export async function makeSession(
	userId: string,
	{ ageSeconds = 0, idleLeftSeconds = 30 * 60 } = {}
): Promise<string> {
	const token = randomBytes(32).toString('hex');
	await db()
		.insert(sessions)
		.values({
			sessionToken: token,
			userId,
			createdAt: new Date(Date.now() - ageSeconds * 1000),
			expires: new Date(Date.now() + idleLeftSeconds * 1000)
		});
	return token;
}

export async function callerFor(
	userId: string,
	organisationId: string | null = null
): Promise<Caller> {
	const actor = await loadActor(userId, organisationId);
	if (!actor) throw new Error('no such active person');
	return { actor, access: { ...access(), userId, organisationId: actor.activeOrganisationId } };
}

/** Access-log rows written since `since`, newest first, optionally for one person. */
export async function logSince(since: Date, userId?: string) {
	return db()
		.select()
		.from(accessLog)
		.where(and(gte(accessLog.at, since), userId ? eq(accessLog.actorUserId, userId) : undefined))
		.orderBy(desc(accessLog.id));
}
