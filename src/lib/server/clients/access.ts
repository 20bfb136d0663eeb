import { eq } from 'drizzle-orm';
import { DEFAULT_MM_PER_FINGER } from '$lib/domain';
import { recordAccess, recordRefusal } from '../audit';
import { config } from '../config';
import type { Caller } from '../context';
import { db } from '../db';
import { clients, users } from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { queueMail } from '../mail/outbox';
import { assertSelf } from '../people/policy';
import { mayListClients, mayWriteClient } from './policy';
import type { FingerFactor } from '$lib/clients/types';
import { clientFor, todayIso } from './shared';

export async function inviteClientToSignIn(
	caller: Caller,
	clientId: string
): Promise<{ sentTo: string }> {
	const client = await clientFor(caller, clientId, 'invitation.sent', mayWriteClient);
	const address = client.email;
	if (!address) {
		throw new ProblemError('conflict', {
			detail: 'Add her e-mail address to the record before inviting her to sign in.'
		});
	}
	return db().transaction(async (tx) => {
		await tx
			.insert(users)
			.values({ email: address, name: client.name })
			.onConflictDoNothing({ target: users.email });
		const [person] = await tx.select().from(users).where(eq(users.email, address));
		const [linked] = await tx
			.select({ id: clients.id })
			.from(clients)
			.where(eq(clients.userId, person!.id));
		if (linked && linked.id !== clientId) {
			throw new ProblemError('conflict', {
				detail: 'This e-mail address already belongs to another client record.'
			});
		}
		await tx
			.update(clients)
			.set({ userId: person!.id, updatedAt: new Date() })
			.where(eq(clients.id, clientId));
		const studio = caller.actor.memberships.find((m) => m.organisationId === client.organisationId);
		await queueMail(tx, {
			to: address,
			kind: 'client.invitation',
			// No health details in a mail: what the record is about is for the signed-in page.
			subject: 'Your record in Seamwell',
			text: [
				`Hello ${client.name},`,
				'',
				`${studio?.organisationName ?? 'Your studio'} keeps your record in Seamwell. You can now see it yourself.`,
				'',
				`Sign in with this e-mail address at ${config().ORIGIN}/signin — we will send you a sign-in link.`,
				'',
				`Sent ${todayIso().slice(0, 10)} at the request of your instructor.`
			].join('\n')
		});
		await recordAccess(tx, caller.access, {
			action: 'invitation.sent',
			outcome: 'success',
			target: { type: 'client', id: clientId },
			clientId
		});
		return { sentTo: address };
	});
}

/**
 * Policy: her own setting (assertSelf). Audit: none (a preference, no client data). The factor
 * the viewing examiner's finger widths are shown at as an mm estimate — display only, never
 * read by a criterion (finger-width scores differ between raters: Bursch 1987).
 */
export async function examinerFactor(caller: Caller): Promise<FingerFactor> {
	assertSelf(caller.actor, caller.actor.userId);
	const [row] = await db()
		.select({ mmPerFinger: users.mmPerFinger })
		.from(users)
		.where(eq(users.id, caller.actor.userId));
	const own = row?.mmPerFinger ?? null;
	return own === null
		? { mmPerFinger: DEFAULT_MM_PER_FINGER, isDefault: true }
		: { mmPerFinger: own, isDefault: false };
}

/**
 * Policy: mayWriteClient. Audit: a refusal only (the write that follows logs its own row).
 * Forms call it before reading their fields, so nobody learns of a record from a form error.
 */
export async function assertMayWriteClient(caller: Caller, clientId: string): Promise<void> {
	await clientFor(caller, clientId, 'client.updated', mayWriteClient);
}

/**
 * Policy: mayListClients. Audit: a refusal only. Pages for adding or listing clients call it
 * before anything else.
 */
export async function assertMayKeepClients(caller: Caller): Promise<void> {
	if (!mayListClients(caller.actor)) {
		await recordRefusal(caller.access, { action: 'client.created' });
		throw notFound();
	}
}
