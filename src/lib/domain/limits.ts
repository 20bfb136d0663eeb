import { SPERSTAD_FINGER_WIDTH } from './criteria';
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
import {
	PAIN_FLAGS,
	RED_FLAG_LABELS,
	RED_FLAG_REFER_TO,
	RED_FLAG_SOURCES,
	type RedFlag
} from './red-flags';
import { holdingSymptoms } from './self-check';
import { formatFingerWidths, siteLabelCapitalised, SITES } from './sites';
import { SOURCES } from './sources';
import { weeksPostpartum } from './weeks';

/**
 * Under 6 weeks after the birth, and until the postnatal check has cleared her, everything but
 * deep stabilisation waits (UK CMO 2019 as restated by NHS pages — a secondary source).
 */
export const POSTNATAL_CHECK_WEEKS = 6;
/** Impact waits until 12 weeks: return to running not before 3 months (Goom et al. 2019). */
export const IMPACT_HOLD_WEEKS = 12;
/** After a caesarean, flexion, long-lever and high-pressure work wait until about 12 weeks (common practice, from memory). */
export const CAESAREAN_HOLD_WEEKS = 12;
/**
 * A site widened by more than this many finger widths since the clinic's last screening is a
 * new finding; half a finger width is the test's own step (trade practice, no source).
 */
export const WIDENING_FINGER_WIDTHS = 0.5;

export const NO_LIMIT_REASON = 'No limit from screenings and no clinician’s decision yet';

const ALL: readonly MovementCategory[] = MOVEMENT_CATEGORIES;
const ALL_BUT_DEEP_STABILITY: readonly MovementCategory[] = MOVEMENT_CATEGORIES.filter(
	(category) => category !== 'deep_stability'
);
const FLEXION_HOLDS: readonly MovementCategory[] = ['loaded_flexion', 'long_lever'];
const PELVIC_FLOOR_HOLDS: readonly MovementCategory[] = ['high_pressure', 'impact'];
const BULGE_HOLDS: readonly MovementCategory[] = ['high_pressure'];
const CAESAREAN_HOLDS: readonly MovementCategory[] = [
	'loaded_flexion',
	'long_lever',
	'high_pressure'
];
const PELVIC_FLOOR_FLAGS: readonly RedFlag[] = ['pelvic_heaviness', 'leakage'];

/** A provisional hold from one rule, before holds on the same category are combined. */
interface Hold {
	categories: readonly MovementCategory[];
	reason: string;
	source: string;
	by: LimitAuthor;
	seeDoctorFirst?: boolean;
}

const DAY = /^\d{4}-\d{2}-\d{2}$/;

function assertDay(value: string, name: string): void {
	if (!DAY.test(value) || Number.isNaN(new Date(value).getTime())) {
		throw new RangeError(`${name} must be a date as YYYY-MM-DD, not ${JSON.stringify(value)}`);
	}
}

function dayOf(date: Date): string {
	return date.toISOString().slice(0, 10);
}

/** Oldest first by when she was screened; two taken together keep the order they were recorded. */
function chronological(screenings: readonly LimitsScreening[]): LimitsScreening[] {
	return [...screenings].sort(
		(a, b) =>
			a.takenAt.getTime() - b.takenAt.getTime() || a.recordedAt.getTime() - b.recordedAt.getTime()
	);
}

/** The clinic had this screening when it set the clearance (recorded no later than both). */
function knownToClearance(screening: LimitsScreening, clearance: LimitsClearance): boolean {
	const recorded = screening.recordedAt.getTime();
	return recorded <= clearance.knownUntil.getTime() && recorded <= clearance.setAt.getTime();
}

interface MedicalSign {
	screening: LimitsScreening;
	flags: RedFlag[];
	labels: string[];
	sources: string[];
}

/**
 * The signs in one screening that send her to a doctor: flags that refer to medical care on
 * their own, and a midline bulge recorded with pain (it may be a hernia; Carlstedt 2020). The
 * stored reasons are read too, so a sign classified as medical when it was taken still counts.
 */
function medicalSignOf(screening: LimitsScreening): MedicalSign | null {
	const recorded = new Set(screening.redFlags);
	const painfulBulge =
		recorded.has('midline_bulge') && PAIN_FLAGS.some((flag) => recorded.has(flag));
	const flags = new Set<RedFlag>(
		screening.redFlags.filter((flag) => RED_FLAG_REFER_TO[flag] === 'medical')
	);
	if (painfulBulge) flags.add('midline_bulge');
	const sources = new Set<string>();
	for (const reason of screening.reasons) {
		if (reason.effect === 'refer' && reason.referTo === 'medical') {
			if (reason.flag) flags.add(reason.flag);
			sources.add(reason.source);
		}
	}
	if (flags.size === 0) return null;
	const list = [...flags];
	for (const flag of list) sources.add(RED_FLAG_SOURCES[flag]);
	if (painfulBulge) sources.add(SOURCES.carlstedt2020);
	if (screening.stage === 'postpartum') sources.add(SOURCES.niceCg37);
	const labels = list.map((flag) =>
		flag === 'midline_bulge' && painfulBulge
			? `${RED_FLAG_LABELS[flag]}, with pain`
			: RED_FLAG_LABELS[flag]
	);
	return { screening, flags: list, labels, sources: [...sources] };
}

/**
 * Medical signs still standing: each one holds until a later screening records that she was
 * seen and the sign has gone (with no such sign of its own), or a clinician's clearance set
 * after it — with the sign in the history the clinic had — lifts it.
 */
function standingMedicalSigns(
	ordered: readonly LimitsScreening[],
	clearance: LimitsClearance | null
): MedicalSign[] {
	let active: MedicalSign[] = [];
	for (const screening of ordered) {
		const sign = medicalSignOf(screening);
		if (sign) active.push(sign);
		else if (screening.medicalSignResolved === true) active = [];
	}
	return clearance ? active.filter((sign) => !knownToClearance(sign.screening, clearance)) : active;
}

function medicalHold(signs: readonly MedicalSign[]): Hold {
	const described = signs
		.map((sign) => `${sign.labels.join('; ')} (recorded ${dayOf(sign.screening.takenAt)})`)
		.join('; ');
	return {
		categories: ALL,
		reason: `See your doctor or midwife first: ${described}. Every movement waits until a clinician has cleared her, or a later screening records that she was seen and the sign has gone.`,
		source: [...new Set(signs.flatMap((sign) => sign.sources))].join('; '),
		by: 'screening',
		seeDoctorFirst: true
	};
}

/** Holds from her latest screening, for a client without a clinician's clearance in force. */
function screeningHolds(latest: LimitsScreening | undefined): Hold[] {
	if (!latest) return [];
	const on = dayOf(latest.takenAt);
	const holds: Hold[] = [];
	if (latest.outcome === 'refer') {
		holds.push({
			categories: FLEXION_HOLDS,
			reason: `Her screening on ${on} calls for a referral: loaded flexion and long-lever abdominal work wait until she has been assessed.`,
			source: SOURCES.flexionPractice,
			by: 'screening'
		});
	}
	const pelvicFloor = latest.redFlags.filter((flag) => PELVIC_FLOOR_FLAGS.includes(flag));
	if (pelvicFloor.length > 0) {
		const felt = pelvicFloor.map((flag) => RED_FLAG_LABELS[flag].toLowerCase()).join('; ');
		holds.push({
			categories: PELVIC_FLOOR_HOLDS,
			reason: `Recorded on ${on}: ${felt}. High-pressure effort and impact wait until a physiotherapist has assessed her.`,
			source: SOURCES.heavinessPractice,
			by: 'screening'
		});
	}
	if (latest.redFlags.includes('midline_bulge')) {
		holds.push({
			categories: BULGE_HOLDS,
			reason: `A bulge along the midline was recorded on ${on}: heavy lifting and breath-holding effort wait until it has been reviewed (a suspected hernia needs imaging or surgical review).`,
			source: SOURCES.carlstedt2020,
			by: 'screening'
		});
	}
	if (latest.stage === 'pregnant') {
		const sites = SITES.filter(
			(site) => latest.sites[site].depth === 'deep' || latest.sites[site].doming
		);
		if (sites.length > 0) {
			holds.push({
				categories: FLEXION_HOLDS,
				reason: `In pregnancy, a deep gap or doming was felt on ${on} (${sites.map(siteLabelCapitalised).join(', ').toLowerCase()}): loaded flexion and long-lever abdominal work wait. A wide gap alone holds nothing in pregnancy.`,
				source: SOURCES.pregnancyLoadPractice,
				by: 'screening'
			});
		}
	}
	return holds;
}

/** Holds and prompts from her record: weeks since the birth, type of birth, postnatal check. */
function recordHolds(client: LimitsClient, today: string): { holds: Hold[]; prompts: string[] } {
	const holds: Hold[] = [];
	const prompts: string[] = [];
	if (client.stage !== 'postpartum') return { holds, prompts };

	const birth = client.birthDate;
	const birthKnown = birth !== null && DAY.test(birth) && birth <= today;
	if (!birthKnown) {
		// Weeks unknown: the cautious reading is that she may still be in her first 6 weeks.
		prompts.push('Record her birth date: until it is, Seamwell holds as in the first 6 weeks.');
		holds.push({
			categories: ALL_BUT_DEEP_STABILITY,
			reason:
				'Her birth date is not recorded, so it is not known whether she is past 6 weeks: everything except deep stabilisation waits until it is.',
			source: SOURCES.postnatalCheck,
			by: 'record'
		});
		return { holds, prompts };
	}

	const weeks = weeksPostpartum(birth, today);
	const weeksWords = `${weeks} ${weeks === 1 ? 'week' : 'weeks'} after the birth`;
	if (weeks < POSTNATAL_CHECK_WEEKS) {
		holds.push({
			categories: ALL_BUT_DEEP_STABILITY,
			reason: `${capitalise(weeksWords)}, under 6 weeks: everything except deep stabilisation waits until her postnatal check.`,
			source: `${SOURCES.postnatalCheck}; ${SOURCES.ucmo2019Postnatal}`,
			by: 'record'
		});
	}

	const checkBooked = client.postnatalCheckOn !== null && client.postnatalCheckOn > today;
	if (client.postnatalCleared === false) {
		holds.push({
			categories: ALL_BUT_DEEP_STABILITY,
			reason:
				'Her postnatal check is recorded as not done or not cleared: everything except deep stabilisation waits until it clears her.',
			source: SOURCES.postnatalCheck,
			by: 'record'
		});
	} else if (client.postnatalCleared !== true && checkBooked) {
		holds.push({
			categories: ALL_BUT_DEEP_STABILITY,
			reason: `Her postnatal check is booked for ${client.postnatalCheckOn} and has not happened yet: everything except deep stabilisation waits until it clears her.`,
			source: SOURCES.postnatalCheck,
			by: 'record'
		});
	} else if (client.postnatalCleared === null && weeks >= POSTNATAL_CHECK_WEEKS) {
		prompts.push(
			'Record her postnatal check: whether it has happened and whether she was cleared. It comes before building intensity.'
		);
	}

	if (weeks < IMPACT_HOLD_WEEKS) {
		holds.push({
			categories: ['impact'],
			reason: `${capitalise(weeksWords)}, under 12 weeks: impact waits until 12 weeks (return to running not before 3 months).`,
			source: SOURCES.goom2019Running,
			by: 'record'
		});
	}
	if (weeks < CAESAREAN_HOLD_WEEKS && client.delivery !== 'vaginal') {
		const unknown = client.delivery === null;
		if (unknown) {
			prompts.push(
				'Record the type of birth: until it is, Seamwell holds as after a caesarean for the first 12 weeks.'
			);
		}
		holds.push({
			categories: CAESAREAN_HOLDS,
			reason: unknown
				? `${capitalise(weeksWords)}, and the type of birth is not recorded: loaded flexion, long-lever and high-pressure work wait until 12 weeks, as after a caesarean.`
				: `${capitalise(weeksWords)} by caesarean, under 12 weeks: loaded flexion, long-lever and high-pressure work wait until 12 weeks.`,
			source: SOURCES.caesareanPractice,
			by: 'record'
		});
	}
	return { holds, prompts };
}

/**
 * Holds from what she reported herself since the studio last screened her and since the
 * clinician's clearance: a symptom at `see_clinician` or above holds what the same flag in a
 * screening would (labelled self-reported). Signs that send her to a doctor stand from any such
 * report; the others follow her latest report, so a later report without them lifts them.
 */
function selfReportHolds(
	reports: readonly LimitsSelfReport[],
	screenings: readonly LimitsScreening[],
	clearance: LimitsClearance | null
): { holds: Hold[]; seeDoctorFirst: boolean } {
	const after = Math.max(
		screenings.at(-1)?.takenAt.getTime() ?? -Infinity,
		clearance?.setAt.getTime() ?? -Infinity
	);
	const recent = [...reports]
		.filter((report) => report.takenAt.getTime() > after)
		.sort((a, b) => a.takenAt.getTime() - b.takenAt.getTime());
	const holds: Hold[] = [];
	const medical: string[] = [];
	const medicalSources = new Set<string>();
	for (const report of recent) {
		for (const flag of holdingSymptoms(report.symptoms)) {
			if (RED_FLAG_REFER_TO[flag] !== 'medical') continue;
			medical.push(`${RED_FLAG_LABELS[flag]} (self-reported ${dayOf(report.takenAt)})`);
			medicalSources.add(RED_FLAG_SOURCES[flag]);
		}
	}
	if (medical.length > 0) {
		holds.push({
			categories: ALL,
			reason: `Self-reported — see a doctor or midwife first: ${[...new Set(medical)].join('; ')}. Every movement waits until a clinician has seen her.`,
			source: [...medicalSources].join('; '),
			by: 'self_report',
			seeDoctorFirst: true
		});
	}
	const latest = recent.at(-1);
	const physio = latest
		? holdingSymptoms(latest.symptoms).filter((flag) => RED_FLAG_REFER_TO[flag] === 'physio')
		: [];
	if (latest && physio.length > 0) {
		const on = dayOf(latest.takenAt);
		const felt = physio.map((flag) => RED_FLAG_LABELS[flag].toLowerCase()).join('; ');
		holds.push({
			categories: FLEXION_HOLDS,
			reason: `Self-reported on ${on}: ${felt}. Loaded flexion and long-lever abdominal work wait until a physiotherapist has seen her.`,
			source: `${physio.map((flag) => RED_FLAG_SOURCES[flag]).join('; ')}; ${SOURCES.flexionPractice}`,
			by: 'self_report'
		});
		if (physio.some((flag) => PELVIC_FLOOR_FLAGS.includes(flag))) {
			holds.push({
				categories: PELVIC_FLOOR_HOLDS,
				reason: `Self-reported on ${on}: ${felt}. High-pressure effort and impact wait until a physiotherapist has assessed her.`,
				source: SOURCES.heavinessPractice,
				by: 'self_report'
			});
		}
		if (physio.includes('midline_bulge')) {
			holds.push({
				categories: BULGE_HOLDS,
				reason: `Self-reported on ${on}: a bulge along the midline. Heavy lifting and breath-holding effort wait until it has been reviewed.`,
				source: SOURCES.carlstedt2020,
				by: 'self_report'
			});
		}
	}
	return { holds, seeDoctorFirst: medical.length > 0 };
}

function capitalise(text: string): string {
	return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Findings in screenings the clinic did not have, each with the provisional holds it matches. */
function newFindingsSince(
	ordered: readonly LimitsScreening[],
	clearance: LimitsClearance
): NewFinding[] {
	const known = ordered.filter((screening) => knownToClearance(screening, clearance));
	const baseline = known.at(-1);
	const findings: NewFinding[] = [];
	const seen = new Set<string>();
	const add = (finding: NewFinding) => {
		const key = `${finding.kind}|${finding.site ?? ''}|${finding.flag ?? ''}`;
		if (seen.has(key) || (finding.holds ?? []).length === 0) return;
		seen.add(key);
		findings.push(finding);
	};

	for (const screening of ordered) {
		if (knownToClearance(screening, clearance)) continue;
		const on = dayOf(screening.takenAt);
		const pregnant = screening.stage === 'pregnant';
		const medical = medicalSignOf(screening);

		for (const flag of screening.redFlags) {
			if (baseline?.redFlags.includes(flag)) continue;
			const toDoctor = medical?.flags.includes(flag) ?? false;
			const holds = new Set<MovementCategory>(toDoctor ? ALL : FLEXION_HOLDS);
			if (PELVIC_FLOOR_FLAGS.includes(flag)) PELVIC_FLOOR_HOLDS.forEach((c) => holds.add(c));
			if (flag === 'midline_bulge') BULGE_HOLDS.forEach((c) => holds.add(c));
			add({
				kind: 'red_flag',
				screeningId: screening.id,
				flag,
				detail: `${RED_FLAG_LABELS[flag]}, recorded on ${on}${toDoctor ? ': see a doctor or midwife first' : ''}.`,
				holds: [...holds]
			});
		}

		for (const site of SITES) {
			const now = screening.sites[site];
			const before = baseline?.sites[site];
			const where = siteLabelCapitalised(site);
			const was = before
				? ` (${formatFingerWidths(before.widthFingers)} when the clearance was set)`
				: '';
			// In pregnancy a wide gap is expected and a soft midline is watched: they hold nothing
			// (Mota 2015), so they are not findings that put a hold back on.
			const widthHolds = pregnant ? [] : [...FLEXION_HOLDS];
			if (
				now.widthFingers >= SPERSTAD_FINGER_WIDTH.value &&
				(!before || before.widthFingers < SPERSTAD_FINGER_WIDTH.value)
			) {
				add({
					kind: 'newly_at_threshold',
					screeningId: screening.id,
					site,
					detail: `${where}: ${formatFingerWidths(now.widthFingers)} on ${on}${was}, at or over ${formatFingerWidths(SPERSTAD_FINGER_WIDTH.value)}.`,
					holds: widthHolds
				});
			}
			if (before && now.widthFingers - before.widthFingers > WIDENING_FINGER_WIDTHS) {
				add({
					kind: 'widened',
					screeningId: screening.id,
					site,
					detail: `${where}: widened to ${formatFingerWidths(now.widthFingers)} on ${on}${was}.`,
					holds: widthHolds
				});
			}
			if (now.depth === 'deep' && before?.depth !== 'deep') {
				add({
					kind: 'newly_deep',
					screeningId: screening.id,
					site,
					detail: `${where}: the fingers sank deep on ${on}.`,
					holds: [...FLEXION_HOLDS]
				});
			}
			if (now.tension === 'soft' && before?.tension !== 'soft') {
				add({
					kind: 'newly_soft',
					screeningId: screening.id,
					site,
					detail: `${where}: the midline felt soft on ${on}.`,
					holds: widthHolds
				});
			}
			if (now.doming && !before?.doming) {
				add({
					kind: 'newly_doming',
					screeningId: screening.id,
					site,
					detail: `${where}: the belly domed along the midline on ${on}.`,
					holds: [...FLEXION_HOLDS]
				});
			}
		}
	}
	return findings;
}

function findingSource(finding: NewFinding, stage: LimitsScreening['stage'] | undefined): string {
	if (finding.kind === 'red_flag' && finding.flag) {
		const sources = [RED_FLAG_SOURCES[finding.flag]];
		if (PELVIC_FLOOR_FLAGS.includes(finding.flag)) sources.push(SOURCES.heavinessPractice);
		if (finding.flag === 'midline_bulge') sources.push(SOURCES.carlstedt2020);
		return [...sources, SOURCES.flexionPractice].join('; ');
	}
	if (stage === 'pregnant') return SOURCES.pregnancyLoadPractice;
	return finding.kind === 'newly_doming'
		? `${SOURCES.domingPractice}; ${SOURCES.flexionPractice}`
		: finding.kind === 'newly_deep' || finding.kind === 'newly_soft'
			? `${SOURCES.deepOrSoftPractice}; ${SOURCES.flexionPractice}`
			: `${SPERSTAD_FINGER_WIDTH.source}; ${SOURCES.flexionPractice}`;
}

function findingHolds(
	findings: readonly NewFinding[],
	screenings: readonly LimitsScreening[]
): Hold[] {
	return findings.map((finding) => {
		const stage = screenings.find((screening) => screening.id === finding.screeningId)?.stage;
		return {
			categories: finding.holds ?? [],
			reason: `New since the clearance: ${finding.detail} Held until a physiotherapist has seen it.`,
			source: findingSource(finding, stage),
			by: 'screening'
		};
	});
}

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
