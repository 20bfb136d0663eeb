import { and, desc, eq, inArray, ne } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { CLINIC_VISIBLE_STATES, type ReferralState } from '../../domain/referral';
import { recordSuccesses } from '../audit';
import { refuse, type Caller } from '../context';
import { clientRow } from '../clients/shared';
import { db } from '../db';
import { organisations, referralEvents, referrals, users } from '../db/schema';
import { notFound } from '../http/problem';
import { instructorStudioIds } from '../scope';

// One client's referrals, for the two people who follow them from her side: the instructors of
// her studio (on her record) and the client herself (in plain words). Drafts are the studio's
// work in progress, so the client sees a referral only once it is sent.

export interface ClientReferral {
	id: string;
	state: ReferralState;
	clinicName: string;
	physioName: string | null;
	createdAt: string;
	sentAt: string | null;
	/** When its state last changed. */
	changedAt: string;
	/** The clinic's own words on its latest decision (accepting, declining, closing), if any. */
	clinicNote: string | null;
}

/**
 * Policy: an instructor of her studio, or the client herself (404 for anyone else). Audit:
 * referral.listed, one row per referral shown (`limit`: the newest ones only).
 */
export async function listClientReferrals(
	caller: Caller,
	clientId: string,
	{ limit }: { limit?: number } = {}
): Promise<ClientReferral[]> {
	const { actor } = caller;
	const client = await clientRow(clientId);
	const asStudio =
		client !== undefined && instructorStudioIds(actor).includes(client.organisationId);
	const asHerself = client !== undefined && actor.clientId === client.id;
	if (!client || (!asStudio && !asHerself)) {
		return refuse(
			caller,
			'referral.listed',
			notFound(),
			{ type: 'client', id: clientId },
			client?.id
		);
	}
	const physio = alias(users, 'physio');
	return db().transaction(async (tx) => {
		const rows = await tx
			.select({
				id: referrals.id,
				state: referrals.state,
				clinicName: organisations.name,
				physioName: physio.name,
				createdAt: referrals.createdAt,
				sentAt: referrals.sentAt,
				updatedAt: referrals.updatedAt
			})
			.from(referrals)
			.innerJoin(organisations, eq(organisations.id, referrals.clinicId))
			.leftJoin(physio, eq(physio.id, referrals.physioId))
			.where(
				and(
					eq(referrals.clientId, client.id),
					eq(referrals.studioId, client.organisationId),
					...(asStudio ? [] : [inArray(referrals.state, [...CLINIC_VISIBLE_STATES])])
				)
			)
			.orderBy(desc(referrals.createdAt))
			.limit(limit ?? Number.MAX_SAFE_INTEGER);
		const ids = rows.map((r) => r.id);
		const notes = ids.length
			? await tx
					.select({
						referralId: referralEvents.referralId,
						reason: referralEvents.reason
					})
					.from(referralEvents)
					.where(
						and(
							inArray(referralEvents.referralId, ids),
							eq(referralEvents.actorRole, 'physiotherapist'),
							ne(referralEvents.reason, '')
						)
					)
					.orderBy(desc(referralEvents.at), desc(referralEvents.id))
			: [];
		await recordSuccesses(
			tx,
			caller.access,
			'referral.listed',
			rows.map((row) => ({
				target: { type: 'referral', id: row.id },
				clientId: client.id
			}))
		);
		return rows.map((row) => ({
			id: row.id,
			state: row.state,
			clinicName: row.clinicName,
			physioName: row.physioName,
			createdAt: row.createdAt.toISOString(),
			sentAt: row.sentAt?.toISOString() ?? null,
			changedAt: row.updatedAt.toISOString(),
			clinicNote: notes.find((n) => n.referralId === row.id)?.reason ?? null
		}));
	});
}
