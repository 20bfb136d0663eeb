import {
	LEVEL_RANK,
	MOVEMENT_CATEGORIES,
	type CategoryLimit,
	type CategoryLimits,
	type EffectiveLimits,
	type LimitAuthor,
	type LimitsClearance,
	type LimitsClient,
	type LimitsScreening,
	type LimitsSelfReport,
	type MovementCategory,
	type NewFinding
} from './movement';
import { SOURCES } from './sources';
import {
	type Hold,
	NO_LIMIT_REASON,
	assertDay,
	chronological,
	dayOf,
	medicalHold,
	screeningHolds,
	standingMedicalSigns
} from './limits-rules';
import { findingHolds, newFindingsSince, recordHolds, selfReportHolds } from './limits-holds';

function clearanceLimits(clearance: LimitsClearance): CategoryLimits {
	const on = dayOf(clearance.setAt);
	const who = `${clearance.setByName} (${clearance.clinicName})`;
	const ended = clearance.sharingEndedOn
		? `; sharing ended on ${clearance.sharingEndedOn} — the last clearance the studio received`
		: '';
	const source = `Clearance set by ${who} on ${on}${ended}`;
	const entries = MOVEMENT_CATEGORIES.map((category): [MovementCategory, CategoryLimit] => {
		const level = clearance.levels[category];
		if (level === 'modify') {
			const modification = clearance.modifications[category] ?? '';
			return [
				category,
				{
					level,
					reason: `Cleared with a change by ${who} on ${on}: ${modification}`,
					source,
					by: 'clinician',
					modification
				}
			];
		}
		const reason =
			level === 'cleared'
				? `Cleared by ${who} on ${on}.`
				: `Not yet: on hold in the clearance by ${who} on ${on}.`;
		return [category, { level, reason, source, by: 'clinician' }];
	});
	return Object.fromEntries(entries) as CategoryLimits;
}

function noLimits(by: LimitAuthor): CategoryLimits {
	const entries = MOVEMENT_CATEGORIES.map((category): [MovementCategory, CategoryLimit] => [
		category,
		{ level: 'no_limit', reason: NO_LIMIT_REASON, source: SOURCES.noProvisionalLimit, by }
	]);
	return Object.fromEntries(entries) as CategoryLimits;
}

/**
 * Put holds on top of base levels; the most restrictive level wins. Holds on the same category
 * are combined with every reason and source. A clinician's own hold stays hers (the new reason
 * is listed in the new findings), except that a sign sending her to a doctor always wins.
 */
function applyHolds(base: CategoryLimits, holds: readonly Hold[]): CategoryLimits {
	const result = { ...base };
	for (const hold of holds) {
		for (const category of hold.categories) {
			const current = result[category];
			const fresh: CategoryLimit = {
				level: 'hold',
				reason: hold.reason,
				source: hold.source,
				by: hold.by,
				...(hold.seeDoctorFirst ? { seeDoctorFirst: true } : {})
			};
			if (hold.seeDoctorFirst && !current.seeDoctorFirst) {
				result[category] = fresh;
			} else if (LEVEL_RANK.hold < LEVEL_RANK[current.level]) {
				result[category] = fresh;
			} else if (current.by !== 'clinician' && !current.seeDoctorFirst) {
				result[category] = {
					...current,
					reason: current.reason.includes(hold.reason)
						? current.reason
						: `${current.reason} ${hold.reason}`,
					source: joinSources(current.source, hold.source)
				};
			}
		}
	}
	return result;
}

function joinSources(a: string, b: string): string {
	const parts = a.split('; ');
	for (const part of b.split('; ')) if (!parts.includes(part)) parts.push(part);
	return parts.join('; ');
}

/**
 * The level of every movement category for one client today: the clinician's clearance in
 * force, with a sign that sends her to a doctor always on top and findings the clinic did not
 * have putting the matching holds back on; without a clearance, the studio's provisional holds
 * from her record and screenings. Plan checks and home practice read only this.
 *
 * `today` is the calendar day (YYYY-MM-DD) weeks since the birth and review dates are read on.
 * `selfReports` are what she reported herself: pass them only where she may see them (her own
 * view) or shares them (the studio's).
 */
export function effectiveLimits(
	client: LimitsClient,
	screenings: readonly LimitsScreening[],
	clearance: LimitsClearance | null,
	today: string,
	selfReports: readonly LimitsSelfReport[] = []
): EffectiveLimits {
	assertDay(today, 'today');
	const ordered = chronological(screenings);

	// A clearance set in pregnancy lapses at the birth: the postpartum rules apply until a new one.
	const clearanceLapsed =
		clearance !== null && clearance.stageAtSet === 'pregnant' && client.stage === 'postpartum';
	const inForce = clearanceLapsed ? null : clearance;

	const prompts: string[] = [];
	let categories: CategoryLimits;
	let newFindings: NewFinding[] = [];
	if (inForce) {
		newFindings = newFindingsSince(ordered, inForce);
		categories = applyHolds(clearanceLimits(inForce), findingHolds(newFindings, ordered));
	} else {
		const record = recordHolds(client, today);
		prompts.push(...record.prompts);
		if (clearanceLapsed) {
			prompts.push(
				'Her clearance was set in pregnancy and lapsed at the birth: the studio’s caution applies until her physiotherapist sets a new one.'
			);
		}
		const holds = [...screeningHolds(ordered.at(-1)), ...record.holds];
		categories = applyHolds(noLimits(ordered.length > 0 ? 'screening' : 'record'), holds);
	}

	// A clinician's clearance lifts a sign only when it was set after it; a lapsed one still
	// shows a clinician saw her after the sign.
	const selfReported = selfReportHolds(selfReports, ordered, clearance);
	categories = applyHolds(categories, selfReported.holds);

	const signs = standingMedicalSigns(ordered, clearance);
	const seeDoctorFirst = signs.length > 0 || selfReported.seeDoctorFirst;
	if (signs.length > 0) categories = applyHolds(categories, [medicalHold(signs)]);

	return {
		categories,
		provisional: inForce === null,
		seeDoctorFirst,
		newFindings,
		reviewOverdue: inForce !== null && today > inForce.reviewOn,
		clearanceLapsed,
		prompts
	};
}
