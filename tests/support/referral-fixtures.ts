import { randomUUID } from 'node:crypto';
import { and, desc, eq, gt } from 'drizzle-orm';
import type { RedFlag } from '../../src/lib/domain/red-flags';
import type { Site, SiteMeasure } from '../../src/lib/domain/sites';
import type { Actor, MemberRole, OrganisationKind } from '../../src/lib/server/actor';
import type { AuditAction } from '../../src/lib/server/audit';
import { buildScreeningRecord } from '../../src/lib/server/clients/screening-record';
import { openReferral } from '../../src/lib/server/referrals/service';
import type { Caller } from '../../src/lib/server/context';
import { db } from '../../src/lib/server/db';
import {
	accessLog,
	clients,
	consentEvents,
	consents,
	memberships,
	organisations,
	outbox,
	referralEvents,
	referrals,
	screenings,
	users
} from '../../src/lib/server/db/schema';
import type { ReferralState } from '../../src/lib/domain/referral';
import type { ShareScope } from '../../src/lib/domain/consent';

// Rows for integration tests, written straight to the database (each test makes its own,
// with unique names, so files never collide), and Callers built the way hooks build them.
// Every name and value here is invented.

const tag = () => randomUUID().slice(0, 8);

export interface Org {
	id: string;
	name: string;
	kind: OrganisationKind;
}

export async function makeOrg(kind: OrganisationKind, label: string = kind): Promise<Org> {
	const name = `${label} ${tag()}`;
	const [row] = await db().insert(organisations).values({ name, kind }).returning();
	return { id: row!.id, name, kind };
}

export interface Person {
	userId: string;
	email: string;
	name: string;
	caller: Caller;
}

function callerFor(actor: Actor, role: string | null): Caller {
	return {
		actor,
		access: {
			userId: actor.userId,
			role,
			organisationId: actor.activeOrganisationId,
			address: '198.51.100.20',
			userAgent: 'integration test'
		}
	};
}

export async function makeMember(
	org: Org,
	role: MemberRole,
	label: string = role
): Promise<Person> {
	const email = `${label}-${tag()}@test.example`;
	const name = `${label} ${tag()}`;
	const [user] = await db().insert(users).values({ email, name }).returning();
	await db().insert(memberships).values({ userId: user!.id, organisationId: org.id, role });
	const actor: Actor = {
		userId: user!.id,
		email,
		name,
		memberships: [{ organisationId: org.id, organisationName: org.name, kind: org.kind, role }],
		clientId: null,
		activeOrganisationId: org.id
	};
	return { userId: user!.id, email, name, caller: callerFor(actor, role) };
}

/**
 * The usual cast of sharing tests: a studio with an instructor, the clinic she refers to with
 * its physiotherapist, and another clinic whose physiotherapist must see nothing.
 */
export async function makeCast() {
	const studio = await makeOrg('studio');
	const clinic = await makeOrg('clinic');
	const otherClinic = await makeOrg('clinic', 'other clinic');
	return {
		studio,
		clinic,
		otherClinic,
		instructor: await makeMember(studio, 'instructor'),
		physio: await makeMember(clinic, 'physiotherapist'),
		otherPhysio: await makeMember(otherClinic, 'physiotherapist', 'elsewhere')
	};
}

export interface ClientPerson extends Person {
	clientId: string;
}

/** A postpartum client of the studio who can sign in, with intake consent. */
export async function makeClient(studio: Org, label = 'client'): Promise<ClientPerson> {
	const email = `${label}-${tag()}@test.example`;
	const name = `${label} ${tag()}`;
	const [user] = await db().insert(users).values({ email, name }).returning();
	const [client] = await db()
		.insert(clients)
		.values({
			organisationId: studio.id,
			userId: user!.id,
			name,
			email,
			stage: 'postpartum',
			birthDate: '2025-01-10',
			delivery: 'vaginal',
			births: 1,
			multiples: false,
			intakeConsentAt: new Date('2025-02-01T10:00:00Z'),
			intakeConsentMethod: 'in_person'
		})
		.returning();
	const actor: Actor = {
		userId: user!.id,
		email,
		name,
		memberships: [],
		clientId: client!.id,
		activeOrganisationId: null
	};
	return {
		userId: user!.id,
		email,
		name,
		clientId: client!.id,
		caller: callerFor(actor, 'client')
	};
}

const measure = (widthFingers: number): SiteMeasure => ({
	widthFingers,
	widthMm: null,
	depth: 'moderate',
	tension: 'soft',
	doming: false
});

/** Records a screening (classified as the clients service would) straight into the table. */
export async function addScreening(
	clientId: string,
	takenAt: Date,
	widths: [number, number, number] = [2.5, 3, 2],
	redFlags: RedFlag[] = []
): Promise<string> {
	const sites: Record<Site, SiteMeasure> = {
		above_navel: measure(widths[0]),
		at_navel: measure(widths[1]),
		below_navel: measure(widths[2])
	};
	const record = buildScreeningRecord(
		{ stage: 'postpartum', dueDate: null, birthDate: '2025-01-10', postnatalCheckOn: null },
		{ takenAt, sites, redFlags }
	);
	const [row] = await db()
		.insert(screenings)
		.values({ clientId, ...record })
		.returning({ id: screenings.id });
	return row!.id;
}

export async function addConsent(
	client: { clientId: string; userId: string },
	studio: Org,
	clinic: Org,
	scopes: ShareScope[] = ['referral', 'screenings', 'clearance', 'documents'],
	times: { startsAt?: Date; endsAt?: Date | null; withdrawnAt?: Date | null } = {}
): Promise<string> {
	const [row] = await db()
		.insert(consents)
		.values({
			clientId: client.clientId,
			studioId: studio.id,
			clinicId: clinic.id,
			scopes,
			startsAt: times.startsAt ?? new Date(Date.now() - 86_400_000),
			endsAt: times.endsAt ?? null,
			withdrawnAt: times.withdrawnAt ?? null,
			givenBy: client.userId
		})
		.returning({ id: consents.id });
	await db()
		.insert(consentEvents)
		.values({ consentId: row!.id, kind: 'given', actorUserId: client.userId });
	return row!.id;
}

/** A referral put straight into a state (for walking the transition table). */
export async function addReferral(options: {
	clientId: string;
	studio: Org;
	clinic: Org;
	createdBy: string;
	state: ReferralState;
	physioId?: string | null;
	urgency?: 'routine' | 'soon';
	sentAt?: Date;
}): Promise<string> {
	const [row] = await db()
		.insert(referrals)
		.values({
			clientId: options.clientId,
			studioId: options.studio.id,
			clinicId: options.clinic.id,
			physioId: options.physioId ?? null,
			createdBy: options.createdBy,
			reason: 'Gap of three finger widths at the navel, soft midline (invented test data).',
			urgency: options.urgency ?? 'routine',
			redFlags: [],
			state: options.state,
			sentAt: options.state === 'draft' ? null : (options.sentAt ?? new Date())
		})
		.returning({ id: referrals.id });
	await db()
		.insert(referralEvents)
		.values({ referralId: row!.id, fromState: null, toState: options.state });
	return row!.id;
}

export async function stateOf(referralId: string): Promise<ReferralState> {
	const [row] = await db()
		.select({ state: referrals.state })
		.from(referrals)
		.where(eq(referrals.id, referralId));
	return row!.state;
}

/** The access-log rows one person left for one action, newest first. */
export async function logRows(userId: string, action?: AuditAction) {
	return db()
		.select()
		.from(accessLog)
		.where(
			action
				? and(eq(accessLog.actorUserId, userId), eq(accessLog.action, action))
				: eq(accessLog.actorUserId, userId)
		)
		.orderBy(desc(accessLog.id));
}

/** Mails queued to an address since a moment (the outbox, before any worker delivers). */
export async function mailsTo(address: string, since: Date) {
	return db()
		.select()
		.from(outbox)
		.where(and(eq(outbox.to, address.toLowerCase()), gt(outbox.createdAt, since)))
		.orderBy(outbox.createdAt);
}

/** The HTTP status a service's thrown problem becomes, or 200 when it answered. */
export async function statusOf(work: Promise<unknown>): Promise<number> {
	try {
		await work;
		return 200;
	} catch (error) {
		const response = (error as { toResponse?: () => Response }).toResponse?.();
		if (!response) throw error;
		return response.status;
	}
}

/** The problem a service threw (for its type and detail). */
export async function problemOf(work: Promise<unknown>) {
	try {
		await work;
	} catch (error) {
		const response = (error as { toResponse?: () => Response }).toResponse?.();
		if (!response) throw error;
		return (await response.json()) as Record<string, unknown> & {
			type: string;
			status: number;
			detail: string;
			errors?: Array<{ pointer: string; message: string }>;
		};
	}
	throw new Error('expected a problem, the service answered');
}

/** A client of the studio with two screenings a month apart (invented widths). */
export async function clientWithHistory(studio: Org): Promise<ClientPerson> {
	const client = await makeClient(studio);
	await addScreening(client.clientId, new Date('2025-03-01T10:00:00Z'), [2, 2.5, 2]);
	await addScreening(client.clientId, new Date('2025-04-01T10:00:00Z'), [2.5, 3, 2]);
	return client;
}

/** The instructor's draft referral of the client to a clinic (an invented reason). */
export const draftReferral = (instructor: Person, client: ClientPerson, clinicId: string) =>
	openReferral(instructor.caller, {
		clientId: client.clientId,
		clinicId,
		physioId: null,
		reason: 'Three finger widths at the navel with doming (invented).',
		urgency: 'soon',
		redFlags: ['pelvic_heaviness']
	});
