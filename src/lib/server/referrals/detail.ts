import { and, asc, eq, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { z } from 'zod';
import { SEND_SCOPES } from '../../domain/consent';
import { transitionsFrom } from '../../domain/referral';
import type { ReferralDetail, ReferralScreening } from '$lib/referrals/types';
import { recordAccess } from '../audit';
import { sharingState } from '../consents/grants';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import {
	clients,
	referralEvents,
	referrals,
	referralSnapshots,
	screenings,
	users
} from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { transitionRoles } from './policy';
import { snapshotClient, snapshotScreenings } from './snapshot';
import { heldClientId, visibleReferral } from './shared';
import {
	type ListRow,
	clinicOrg,
	creatorUser,
	listColumns,
	physioUser,
	studioOrg,
	toListItem
} from './lists';
import { instructorStudioIds } from '../scope';

// ── One referral ───────────────────────────────────────────────────────────────────────

/**
 * Policy: mayReadReferral (the studio's instructors; the clinic's physiotherapists once it is
 * sent). Audit: referral.read. The clinic reads the copy it received when the referral was
 * sent, also after sharing ended (labelled with the date it ended).
 */
export async function getReferral(caller: Caller, id: string): Promise<ReferralDetail> {
	const row = await visibleReferral(caller, id, 'referral.read');
	const { actor } = caller;
	const viewer = instructorStudioIds(actor).includes(row.studioId) ? 'studio' : 'clinic';
	return db().transaction(async (tx) => {
		const [listRow] = (await tx
			.select({ ...listColumns, creatorName: creatorUser.name })
			.from(referrals)
			.leftJoin(clients, eq(clients.id, referrals.clientId))
			.leftJoin(referralSnapshots, eq(referralSnapshots.referralId, referrals.id))
			.innerJoin(studioOrg, eq(studioOrg.id, referrals.studioId))
			.innerJoin(clinicOrg, eq(clinicOrg.id, referrals.clinicId))
			.leftJoin(physioUser, eq(physioUser.id, referrals.physioId))
			.leftJoin(creatorUser, eq(creatorUser.id, referrals.createdBy))
			.where(eq(referrals.id, id))) as Array<ListRow & { creatorName: string | null }>;
		if (!listRow) throw notFound();
		const current = listRow.referral;
		const actorUser = alias(users, 'actor_user');
		const events = await tx
			.select({
				from: referralEvents.fromState,
				to: referralEvents.toState,
				at: referralEvents.at,
				byName: actorUser.name,
				byRole: referralEvents.actorRole,
				reason: referralEvents.reason
			})
			.from(referralEvents)
			.leftJoin(actorUser, eq(actorUser.id, referralEvents.actorUserId))
			.where(eq(referralEvents.referralId, id))
			.orderBy(asc(referralEvents.id));
		const [snapshot] = await tx
			.select()
			.from(referralSnapshots)
			.where(eq(referralSnapshots.referralId, id));

		let client: ReferralDetail['client'];
		let shown: ReferralScreening[];
		if (snapshot) {
			client = snapshot.client;
			shown = snapshot.screenings;
		} else {
			// A draft: only its own studio sees it, and the preview is the record as it stands.
			const clientId = heldClientId(current);
			const [record] = await tx.select().from(clients).where(eq(clients.id, clientId));
			const history = await tx
				.select()
				.from(screenings)
				.where(eq(screenings.clientId, clientId))
				.orderBy(asc(screenings.takenAt));
			client = snapshotClient(record!);
			shown = snapshotScreenings(history);
		}
		const pair = {
			clientId: current.clientId,
			studioId: current.studioId,
			clinicId: current.clinicId
		};
		const sending = await sharingState(tx, pair, SEND_SCOPES);
		const live = await sharingState(tx, pair, ['screenings']);
		const roles = transitionRoles(actor, current);
		await recordAccess(tx, caller.access, {
			action: 'referral.read',
			outcome: 'success',
			target: { type: 'referral', id },
			clientId: current.clientId
		});
		return {
			...toListItem(listRow),
			reason: current.reason,
			redFlags: current.redFlags,
			createdById: current.createdBy,
			createdByName: listRow.creatorName,
			viewer,
			client,
			history: events.map((e) => ({ ...e, at: e.at.toISOString() })),
			screenings: shown,
			snapshotTakenAt: snapshot?.takenAt.toISOString() ?? null,
			sharing: {
				status: sending.status,
				endedAt: sending.endedAt?.toISOString() ?? null,
				canSend: sending.covered,
				screeningsLive: live.covered
			},
			actions: transitionsFrom(current.state, roles).map((t) => ({
				to: t.to,
				reasonRequired: t.reasonRequired
			}))
		};
	});
}

const liveCursor = z.object({ t: z.iso.datetime(), id: z.uuid() });

/**
 * Policy: mayReadReferral, and for the clinic a grant in force with `screenings` (read fresh;
 * without it the read is refused and logged). Audit: screening.read. Her live screening
 * history, oldest first — including screenings recorded after the referral was sent.
 */
export async function listLiveScreenings(
	caller: Caller,
	referralId: string,
	query: { limit: number; cursor?: string }
): Promise<Page<ReferralScreening>> {
	const row = await visibleReferral(caller, referralId, 'screening.read');
	const studioSide = instructorStudioIds(caller.actor).includes(row.studioId);
	const after = decodeCursor(query.cursor, liveCursor);
	if (!studioSide) {
		const state = await sharingState(db(), row, ['screenings']);
		if (!state.covered) {
			const ended = state.endedAt
				? ` Sharing ended on ${state.endedAt.toISOString().slice(0, 10)}.`
				: '';
			return refuse(
				caller,
				'screening.read',
				new ProblemError('forbidden', {
					detail: `The client has not consented to share her screening history with your clinic.${ended} The copy sent with the referral stays readable.`
				}),
				{ type: 'referral', id: referralId },
				row.clientId
			);
		}
	}
	return db().transaction(async (tx) => {
		const where: SQL[] = [eq(screenings.clientId, heldClientId(row))];
		if (after) {
			where.push(
				sql`(${screenings.takenAt}, ${screenings.id}) > (${after.t}::timestamptz, ${after.id}::uuid)`
			);
		}
		const rows = await tx
			.select()
			.from(screenings)
			.where(and(...where))
			.orderBy(asc(screenings.takenAt), asc(screenings.id))
			.limit(query.limit + 1);
		const page = toPage(rows, query.limit, (last) => ({
			t: last.takenAt.toISOString(),
			id: last.id
		}));
		await recordAccess(tx, caller.access, {
			action: 'screening.read',
			outcome: 'success',
			target: { type: 'referral', id: referralId },
			clientId: row.clientId
		});
		return { items: snapshotScreenings(page.items), nextCursor: page.nextCursor };
	});
}
