import { asc, eq } from 'drizzle-orm';
import type { AssessmentData } from '$lib/clearance/schemas';
import type { AssessmentPoint, HerniaFinding } from '$lib/clearance/types';
import { findTransition } from '../../domain/referral';
import { recordAccess } from '../audit';
import { sharingState } from '../consents/grants';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import { assessments, referrals, users } from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { applyTransition } from '../referrals/service';
import { referralRow } from '../referrals/shared';
import { compareAssessments, type AssessmentComparisons } from './comparisons';
import {
	ASSESSABLE_STATES,
	isReferringStudio,
	mayReadAssessment,
	mayRecordAssessment
} from './policy';

// A physiotherapist's findings for a referral. Appended, never overwritten: the first one
// moves the referral accepted → assessed through the referral's own transition table, in the
// same transaction, so findings and state never disagree.

type ReferralRow = typeof referrals.$inferSelect;

export interface AssessmentView {
	id: string;
	referralId: string;
	points: AssessmentPoint[];
	hernia: HerniaFinding;
	pelvicFloor: string | null;
	plan: string;
	recordedBy: { id: string | null; name: string | null };
	recordedAt: string;
}

/**
 * Policy: mayRecordAssessment (the assigned physiotherapist; anyone else 404, the referring
 * studio 403), the referral accepted or assessed (409), consent with `referral` in force,
 * read fresh and held (409). Audit: assessment.recorded (+ referral.transitioned on the move).
 */
export async function recordAssessment(
	caller: Caller,
	referralId: string,
	input: AssessmentData
): Promise<{ id: string; state: ReferralRow['state'] }> {
	const row = await referralRow(referralId);
	const target = { type: 'referral', id: referralId };
	if (!row || !mayRecordAssessment(caller.actor, row)) {
		const known =
			row && (isReferringStudio(caller.actor, row) || mayReadAssessment(caller.actor, row));
		return refuse(
			caller,
			'assessment.recorded',
			known
				? new ProblemError('forbidden', {
						detail: 'Assessments are recorded by the physiotherapist the referral is assigned to.'
					})
				: notFound(),
			target,
			row?.clientId
		);
	}
	if (!ASSESSABLE_STATES.includes(row.state)) {
		return refuse(
			caller,
			'assessment.recorded',
			new ProblemError('invalid-transition', {
				detail: `Findings are recorded on an accepted referral; this one is ${row.state}.`,
				state: row.state
			}),
			target,
			row.clientId
		);
	}
	try {
		return await db().transaction(async (tx) => {
			let state = row.state;
			if (row.state === 'accepted') {
				const moved = await applyTransition(
					tx,
					caller,
					row,
					findTransition('accepted', 'assessed')!,
					null
				);
				state = moved.state;
			} else {
				const pair = { clientId: row.clientId, studioId: row.studioId, clinicId: row.clinicId };
				const sharing = await sharingState(tx, pair, ['referral'], new Date(), { lock: true });
				if (!sharing.covered) throw consentEnded();
				// Hold the state against a concurrent close or withdrawal until this commits.
				const [still] = await tx
					.select({ state: referrals.state })
					.from(referrals)
					.where(eq(referrals.id, row.id))
					.for('update');
				if (still?.state !== 'assessed') {
					throw new ProblemError('invalid-transition', {
						detail: 'The referral changed while you were recording: reload it and try again.',
						state: still?.state ?? null
					});
				}
			}
			const [saved] = await tx
				.insert(assessments)
				.values({
					referralId: row.id,
					clientId: row.clientId,
					clinicId: row.clinicId,
					points: input.points,
					hernia: input.hernia,
					pelvicFloor: input.pelvicFloor,
					plan: input.plan,
					recordedBy: caller.actor.userId
				})
				.returning({ id: assessments.id });
			await recordAccess(tx, caller.access, {
				action: 'assessment.recorded',
				outcome: 'success',
				target: { type: 'assessment', id: saved!.id },
				clientId: row.clientId
			});
			return { id: saved!.id, state };
		});
	} catch (error) {
		if (
			error instanceof ProblemError &&
			(error.slug === 'consent-required' || error.slug === 'invalid-transition')
		) {
			await refuse(caller, 'assessment.recorded', error, target, row.clientId);
		}
		throw error;
	}
}

function consentEnded(): ProblemError {
	return new ProblemError('consent-required', {
		detail:
			"The client's consent to share with your clinic is not in force, so no new findings can be added to this referral."
	});
}

export interface AssessmentRead {
	current: AssessmentView | null;
	/** Every assessment of the referral, newest first (the current one included). */
	history: AssessmentView[];
	comparisons: AssessmentComparisons | null;
}

/**
 * Policy: mayReadAssessment (the clinic's physiotherapists; the referring studio 403, anyone
 * else 404). Audit: assessment.read. The clinic keeps its own findings after sharing ends.
 */
export async function readAssessment(caller: Caller, referralId: string): Promise<AssessmentRead> {
	const history = await readAssessments(caller, referralId);
	return {
		current: history[0] ?? null,
		history,
		comparisons: history[0] ? compareAssessments(history[0], history[1] ?? null) : null
	};
}

/**
 * Policy: as readAssessment. Audit: assessment.read. Every assessment of the referral, newest
 * first.
 */
export async function readAssessments(
	caller: Caller,
	referralId: string
): Promise<AssessmentView[]> {
	const row = await referralRow(referralId);
	const target = { type: 'referral', id: referralId };
	if (!row || !mayReadAssessment(caller.actor, row)) {
		return refuse(
			caller,
			'assessment.read',
			row && isReferringStudio(caller.actor, row)
				? new ProblemError('forbidden', {
						detail:
							"Findings stay in the clinic's record; the studio receives the clearance and the documents the physiotherapist shares."
					})
				: notFound(),
			target,
			row?.clientId
		);
	}
	return db().transaction(async (tx) => {
		const rows = await tx
			.select({ a: assessments, name: users.name })
			.from(assessments)
			.leftJoin(users, eq(users.id, assessments.recordedBy))
			.where(eq(assessments.referralId, referralId))
			.orderBy(asc(assessments.recordedAt), asc(assessments.id));
		await recordAccess(tx, caller.access, {
			action: 'assessment.read',
			outcome: 'success',
			target,
			clientId: row.clientId
		});
		return rows.reverse().map(({ a, name }) => ({
			id: a.id,
			referralId: a.referralId,
			points: a.points,
			hernia: a.hernia,
			pelvicFloor: a.pelvicFloor,
			plan: a.plan,
			recordedBy: { id: a.recordedBy, name },
			recordedAt: a.recordedAt.toISOString()
		}));
	});
}

/**
 * Policy: mayReadAssessment (the clinic's physiotherapists). Audit: a refusal only. For the
 * referral page's assessment and clearance forms: anyone else finds no such form (404) before
 * her input is even read.
 */
export async function assertClinicForms(caller: Caller, referralId: string): Promise<void> {
	const row = await referralRow(referralId);
	if (!row || !mayReadAssessment(caller.actor, row)) {
		return refuse(
			caller,
			'assessment.recorded',
			notFound(),
			{ type: 'referral', id: referralId },
			row?.clientId
		);
	}
}
