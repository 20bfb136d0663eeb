import { and, asc, desc, eq, inArray, isNull, ne } from 'drizzle-orm';
import type { ClearanceData } from '$lib/clearance/schemas';
import type { ClearanceVersion, ClearanceView } from '$lib/clearance/types';
import { effectiveLimits } from '../../domain/limits';
import { recordAccess } from '../audit';
import { sharingState } from '../consents/grants';
import { config } from '../config';
import { refuse, type Caller } from '../context';
import { clientRow } from '../clients/shared';
import { db, type Executor } from '../db';
import {
	clearanceReviewRequests,
	clearances,
	clients,
	organisations,
	referrals,
	referralSnapshots,
	screenings,
	users
} from '../db/schema';
import { fieldProblem, notFound, ProblemError } from '../http/problem';
import { queueNotification } from '../mail/outbox';
import { instructorRecipient } from '../referrals/notify';
import { limitsClearance, limitsClient, limitsScreening, selfReportsFor } from './limits';
import { clearanceViewer, clearingReferrals, type ClearanceViewer } from './policy';
import { instructorStudioIds } from '../scope';

// Setting and reading a client's clearance. A new clearance supersedes the one before (the
// client's row is locked while it is written, so two physiotherapists saving at once queue
// up); every version stays readable with who set it and when. The studio keeps what it
// received after the client withdraws sharing, labelled with the day sharing ended.

type ClearanceRow = typeof clearances.$inferSelect;

export type { ClearanceVersion, ClearanceView };

export const todayUtc = (now = new Date()) => now.toISOString().slice(0, 10);

async function clientScope(id: string) {
	const client = await clientRow(id);
	if (!client) return { client: undefined, referrals: [] };
	const rows = await db()
		.select()
		.from(referrals)
		.where(and(eq(referrals.clientId, id), ne(referrals.state, 'draft')))
		.orderBy(desc(referrals.sentAt));
	return { client, referrals: rows };
}

/**
 * Policy: clearingReferrals (the physiotherapist assigned to one of her accepted or assessed
 * referrals; her studio and she herself 403, anyone else 404) and consent with `clearance` in
 * force, read fresh and held (409 consent-required). Audit: clearance.set.
 */
export async function setClearance(
	caller: Caller,
	clientId: string,
	input: ClearanceData
): Promise<{ id: string }> {
	const { actor } = caller;
	const target = { type: 'client', id: clientId };
	const { client, referrals: theirs } = await clientScope(clientId);
	const allowed = client ? clearingReferrals(actor, theirs) : [];
	if (!client || allowed.length === 0) {
		const knows =
			client &&
			(instructorStudioIds(actor).includes(client.organisationId) ||
				actor.clientId === client.id ||
				clearanceViewer(actor, client, theirs) !== null);
		return refuse(
			caller,
			'clearance.set',
			knows
				? new ProblemError('forbidden', {
						detail:
							'A clearance is set by the physiotherapist assigned to an accepted referral for this client.'
					})
				: notFound(),
			target,
			client?.id
		);
	}
	const referral = input.referralId ? allowed.find((r) => r.id === input.referralId) : allowed[0];
	if (!referral) {
		return refuse(
			caller,
			'clearance.set',
			fieldProblem(
				'/referralId',
				'not a referral of yours for this client',
				'Name an accepted or assessed referral for this client that is assigned to you.'
			),
			target,
			client.id
		);
	}
	const pair = { clientId, studioId: referral.studioId, clinicId: referral.clinicId };
	try {
		return await db().transaction(async (tx) => {
			const now = new Date();
			// One writer per client at a time: the supersession chain stays a line.
			const [record] = await tx
				.select()
				.from(clients)
				.where(eq(clients.id, clientId))
				.for('update');
			const sharing = await sharingState(tx, pair, ['clearance'], now, { lock: true });
			if (!sharing.covered) {
				throw new ProblemError('consent-required', {
					detail:
						'The client has not consented to share a clearance from your clinic with her studio (or has withdrawn it), so none can be set.'
				});
			}
			const knownUntil = await historyKnownUntil(tx, pair, referral.id, now);
			const [previous] = await tx
				.select({ id: clearances.id })
				.from(clearances)
				.where(eq(clearances.clientId, clientId))
				.orderBy(desc(clearances.setAt), desc(clearances.id))
				.limit(1);
			const [saved] = await tx
				.insert(clearances)
				.values({
					clientId,
					clinicId: referral.clinicId,
					referralId: referral.id,
					levels: input.categories,
					modifications: input.modifications,
					notes: input.notes,
					reviewOn: input.reviewOn,
					setBy: actor.userId,
					setAt: now,
					stageAtSet: record!.stage,
					knownUntil,
					supersedes: previous?.id ?? null
				})
				.returning({ id: clearances.id });
			// A new clearance answers the studio's open requests to review the last one.
			await tx
				.update(clearanceReviewRequests)
				.set({ seenAt: now })
				.where(
					and(
						eq(clearanceReviewRequests.clientId, clientId),
						eq(clearanceReviewRequests.clinicId, referral.clinicId),
						isNull(clearanceReviewRequests.seenAt)
					)
				);
			await recordAccess(tx, caller.access, {
				action: 'clearance.set',
				outcome: 'success',
				target: { type: 'clearance', id: saved!.id },
				clientId
			});
			// The studio sees it at once; a mail only says there is something to see.
			const origin = config().ORIGIN;
			for (const to of await instructorRecipient(tx, referral.createdBy)) {
				await queueNotification(tx, {
					to,
					kind: 'clearance.set',
					link: `${origin}/clients/${clientId}`
				});
			}
			return { id: saved!.id };
		});
	} catch (error) {
		if (error instanceof ProblemError && error.slug === 'consent-required') {
			await refuse(caller, 'clearance.set', error, target, clientId);
		}
		throw error;
	}
}

/**
 * What the clinic had of her screening history when it set the clearance: all of it while
 * `screenings` is shared live, else the copy sent with the referral.
 */
async function historyKnownUntil(
	tx: Executor,
	pair: { clientId: string; studioId: string; clinicId: string },
	referralId: string,
	now: Date
): Promise<Date> {
	const live = await sharingState(tx, pair, ['screenings'], now);
	if (live.covered) return now;
	const [snapshot] = await tx
		.select({ takenAt: referralSnapshots.takenAt })
		.from(referralSnapshots)
		.where(eq(referralSnapshots.referralId, referralId));
	return snapshot?.takenAt ?? now;
}

function toVersion(
	row: ClearanceRow,
	names: { setByName: string | null; clinicName: string },
	successors: Map<string, string>
): ClearanceVersion {
	return {
		id: row.id,
		categories: row.levels,
		modifications: row.modifications,
		notes: row.notes,
		reviewOn: row.reviewOn,
		setBy: { id: row.setBy, name: names.setByName },
		clinicId: row.clinicId,
		clinicName: names.clinicName,
		referralId: row.referralId,
		setAt: row.setAt.toISOString(),
		sharingEndedOn: row.sharingEndedOn,
		supersededBy: successors.get(row.id) ?? null
	};
}

/**
 * Policy: clearanceViewer (her studio's instructors and she herself see every version; a
 * clinic she was referred to sees its own; anyone else 404). Audit: clearance.read. With the
 * effective levels of every category, as the plan check reads them.
 */
export async function readClearance(caller: Caller, clientId: string): Promise<ClearanceView> {
	const { client, referrals: theirs } = await clientScope(clientId);
	const viewer = client ? clearanceViewer(caller.actor, client, theirs) : null;
	if (!client || !viewer) {
		return refuse(
			caller,
			'clearance.read',
			notFound(),
			{ type: 'client', id: clientId },
			client?.id
		);
	}
	return db().transaction(async (tx) => {
		const today = todayUtc();
		const rows = await tx
			.select({ clearance: clearances, setByName: users.name, clinicName: organisations.name })
			.from(clearances)
			.innerJoin(organisations, eq(organisations.id, clearances.clinicId))
			.leftJoin(users, eq(users.id, clearances.setBy))
			.where(
				viewer.kind === 'clinic'
					? and(eq(clearances.clientId, clientId), eq(clearances.clinicId, viewer.clinicId))
					: eq(clearances.clientId, clientId)
			)
			.orderBy(desc(clearances.setAt), desc(clearances.id));
		const successors = new Map(
			rows
				.filter((r) => r.clearance.supersedes)
				.map((r) => [r.clearance.supersedes!, r.clearance.id])
		);
		const record = await clientRow(clientId, tx);
		const history = await screeningsFor(tx, viewer, theirs, clientId, rows[0]?.clearance);
		const newest = rows[0];
		// Her own reports: to her always, to her studio while she shares, never to the clinic.
		const reports = await selfReportsFor(
			tx,
			[record!],
			viewer.kind === 'client' ? 'all' : viewer.kind === 'studio' ? 'shared' : 'none'
		);
		const limits = effectiveLimits(
			limitsClient(record!),
			history.map(limitsScreening),
			newest ? limitsClearance(newest.clearance, newest) : null,
			today,
			reports.get(clientId) ?? []
		);
		await recordAccess(tx, caller.access, {
			action: 'clearance.read',
			outcome: 'success',
			target: { type: 'client', id: clientId },
			clientId
		});
		const versions = rows.map((r) => toVersion(r.clearance, r, successors));
		return {
			current: versions[0] ? { ...versions[0], reviewOverdue: limits.reviewOverdue } : null,
			effective: limits.categories,
			provisional: limits.provisional,
			seeDoctorFirst: limits.seeDoctorFirst,
			clearanceLapsed: limits.clearanceLapsed,
			reviewOverdue: limits.reviewOverdue,
			newFindings: limits.newFindings,
			prompts: limits.prompts,
			history: versions,
			viewer: viewer.kind
		};
	});
}

/**
 * The screenings a viewer's limits are computed from: the studio and the client have all of
 * them; a clinic has them while `screenings` is shared live, else only what it received.
 */
async function screeningsFor(
	tx: Executor,
	viewer: ClearanceViewer,
	theirs: Array<typeof referrals.$inferSelect>,
	clientId: string,
	newest: ClearanceRow | undefined
) {
	const all = await tx
		.select()
		.from(screenings)
		.where(eq(screenings.clientId, clientId))
		.orderBy(asc(screenings.takenAt), asc(screenings.id));
	if (viewer.kind !== 'clinic') return all;
	const mine = theirs.filter((r) => r.clinicId === viewer.clinicId);
	const pair = { clientId, studioId: mine[0]!.studioId, clinicId: viewer.clinicId };
	if ((await sharingState(tx, pair, ['screenings'])).covered) return all;
	const snapshots = await tx
		.select({ takenAt: referralSnapshots.takenAt })
		.from(referralSnapshots)
		.where(
			inArray(
				referralSnapshots.referralId,
				mine.map((r) => r.id)
			)
		);
	const known = Math.max(
		newest?.knownUntil.getTime() ?? 0,
		...snapshots.map((s) => s.takenAt.getTime())
	);
	return all.filter((s) => s.createdAt.getTime() <= known);
}
