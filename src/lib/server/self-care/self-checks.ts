import { desc, eq } from 'drizzle-orm';
import {
	fingerCheckOffer,
	selfCheckAdvice,
	selfCheckSymptoms,
	type AdviceLevel,
	type FingerCheckOffer,
	type RedFlag,
	type SelfCheckSites,
	type Stage
} from '../../domain';
import type { SelfCheckInputData } from '../../self-care/schemas';
import { recordAccess, recordAccesses, recordSuccesses } from '../audit';
import { refuse, type Caller } from '../context';
import { clientRow } from '../clients/shared';
import { db } from '../db';
import { organisations, selfChecks, selfCheckSharing } from '../db/schema';
import { notFound } from '../http/problem';
import { mayReadSelfChecks } from './policy';
import { fieldProblem, isShared, ownClient, todayUtc } from './shared';

// ── Self-checks ─────────────────────────────────────────────────────────────────────────

export interface SelfCheckView {
	id: string;
	takenAt: string;
	symptoms: RedFlag[];
	sites: SelfCheckSites | null;
	advice: { level: AdviceLevel; text: string };
	selfReported: true;
}

export function toView(row: typeof selfChecks.$inferSelect): SelfCheckView {
	const advice = selfCheckAdvice({ symptoms: row.symptoms, sites: row.sites });
	return {
		id: row.id,
		takenAt: row.takenAt.toISOString(),
		symptoms: row.symptoms,
		sites: row.sites,
		advice: { level: row.adviceLevel, text: advice.text },
		selfReported: true
	};
}

export interface SelfCheckSetup {
	stage: Stage;
	studio: { id: string; name: string };
	shared: boolean;
	symptoms: RedFlag[];
	/** Whether the finger-width part is offered today, before any answer about the wound. */
	offer: FingerCheckOffer;
	caesarean: boolean;
	checks: SelfCheckView[];
}

/**
 * Policy: mayUseOwnSelfCare. Audit: self_check.read per check listed. Her self-checks, newest
 * first, with what the page needs to guide her: her symptom list, the offer, her sharing.
 */
export async function listOwnSelfChecks(caller: Caller): Promise<SelfCheckSetup> {
	const client = await ownClient(caller, 'self_check.read');
	return db().transaction(async (tx) => {
		const rows = await tx
			.select()
			.from(selfChecks)
			.where(eq(selfChecks.clientId, client.id))
			.orderBy(desc(selfChecks.takenAt))
			.limit(50);
		const [studio] = await tx
			.select({ id: organisations.id, name: organisations.name })
			.from(organisations)
			.where(eq(organisations.id, client.organisationId));
		const shared = await isShared(tx, client);
		await recordAccesses(
			tx,
			caller.access,
			rows.length > 0
				? rows.map((row) => ({
						action: 'self_check.read' as const,
						outcome: 'success' as const,
						target: { type: 'self_check', id: row.id },
						clientId: client.id
					}))
				: [
						{
							action: 'self_check.read',
							outcome: 'success',
							target: { type: 'client', id: client.id },
							clientId: client.id
						}
					]
		);
		return {
			stage: client.stage,
			studio: studio ?? { id: client.organisationId, name: 'Your studio' },
			shared,
			symptoms: selfCheckSymptoms(client.stage),
			offer: fingerCheckOffer(
				{
					stage: client.stage,
					birthDate: client.birthDate,
					delivery: client.delivery,
					woundHealed: null
				},
				todayUtc()
			),
			caesarean: client.delivery !== 'vaginal',
			checks: rows.map(toView)
		};
	});
}

/**
 * Policy: mayUseOwnSelfCare. Audit: self_check.recorded. Refuses finger widths where the
 * finger-width part is not offered (pregnancy, under 6 weeks, a healing caesarean wound).
 */
export async function recordSelfCheck(
	caller: Caller,
	input: SelfCheckInputData
): Promise<{ id: string; advice: { level: AdviceLevel; text: string } }> {
	const client = await ownClient(caller, 'self_check.recorded');
	const sites = input.sites ?? null;
	if (sites) {
		const offer = fingerCheckOffer(
			{
				stage: client.stage,
				birthDate: client.birthDate,
				delivery: client.delivery,
				woundHealed: input.woundHealed ?? null
			},
			input.takenAt.toISOString().slice(0, 10)
		);
		if (!offer.offered) {
			throw fieldProblem('/sites', `not offered: ${offer.text}`);
		}
	}
	const advice = selfCheckAdvice({ symptoms: input.symptoms, sites });
	return db().transaction(async (tx) => {
		const [row] = await tx
			.insert(selfChecks)
			.values({
				clientId: client.id,
				takenAt: input.takenAt,
				symptoms: input.symptoms,
				sites,
				woundHealed: input.woundHealed ?? null,
				adviceLevel: advice.level
			})
			.returning({ id: selfChecks.id });
		await recordAccess(tx, caller.access, {
			action: 'self_check.recorded',
			outcome: 'success',
			target: { type: 'self_check', id: row!.id },
			clientId: client.id
		});
		return { id: row!.id, advice: { level: advice.level, text: advice.text } };
	});
}

/**
 * Policy: mayUseOwnSelfCare, for her own studio only (another studio id is 404). Audit:
 * self_check.sharing_changed. One tap to start or stop.
 */
export async function setSelfCheckSharing(
	caller: Caller,
	input: { studioId: string; share: boolean }
): Promise<{ studioId: string; shared: boolean }> {
	const client = await ownClient(caller, 'self_check.sharing_changed');
	if (client.organisationId !== input.studioId) {
		return refuse(caller, 'self_check.sharing_changed', notFound(), {
			type: 'organisation',
			id: input.studioId
		});
	}
	return db().transaction(async (tx) => {
		await tx
			.insert(selfCheckSharing)
			.values({ clientId: client.id, organisationId: input.studioId, shared: input.share })
			.onConflictDoUpdate({
				target: [selfCheckSharing.clientId, selfCheckSharing.organisationId],
				set: { shared: input.share, changedAt: new Date() }
			});
		await recordAccess(tx, caller.access, {
			action: 'self_check.sharing_changed',
			outcome: 'success',
			target: { type: 'organisation', id: input.studioId },
			clientId: client.id
		});
		return { studioId: input.studioId, shared: input.share };
	});
}

/**
 * Policy: mayReadSelfChecks (an instructor of her studio, while she shares; else 404). Audit:
 * self_check.read per check. Marked self-reported; never part of the screenings.
 */
export async function listClientSelfChecks(
	caller: Caller,
	clientId: string
): Promise<SelfCheckView[]> {
	const client = await clientRow(clientId);
	const shared = client ? await isShared(db(), client) : false;
	if (!client || !mayReadSelfChecks(caller.actor, client, shared)) {
		return refuse(
			caller,
			'self_check.read',
			notFound(),
			{ type: 'client', id: clientId },
			client?.id
		);
	}
	return db().transaction(async (tx) => {
		const rows = await tx
			.select()
			.from(selfChecks)
			.where(eq(selfChecks.clientId, client.id))
			.orderBy(desc(selfChecks.takenAt))
			.limit(50);
		await recordSuccesses(
			tx,
			caller.access,
			'self_check.read',
			rows.map((row) => ({
				target: { type: 'self_check', id: row.id },
				clientId: client.id
			}))
		);
		return rows.map(toView);
	});
}
