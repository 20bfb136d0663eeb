import { SPERSTAD_FINGER_WIDTH } from './criteria';
import {
	type LimitsClearance,
	type LimitsClient,
	type LimitsScreening,
	type LimitsSelfReport,
	type MovementCategory,
	type NewFinding
} from './movement';
import { RED_FLAG_LABELS, RED_FLAG_REFER_TO, RED_FLAG_SOURCES } from './red-flags';
import { holdingSymptoms } from './self-check';
import { formatFingerWidths, siteLabelCapitalised, SITES } from './sites';
import { SOURCES } from './sources';
import { weeksPostpartum } from './weeks';
import {
	ALL,
	ALL_BUT_DEEP_STABILITY,
	BULGE_HOLDS,
	CAESAREAN_HOLDS,
	CAESAREAN_HOLD_WEEKS,
	DAY,
	FLEXION_HOLDS,
	type Hold,
	IMPACT_HOLD_WEEKS,
	PELVIC_FLOOR_FLAGS,
	PELVIC_FLOOR_HOLDS,
	POSTNATAL_CHECK_WEEKS,
	WIDENING_FINGER_WIDTHS,
	dayOf,
	knownToClearance,
	medicalSignOf
} from './limits-rules';

export function recordHolds(
	client: LimitsClient,
	today: string
): { holds: Hold[]; prompts: string[] } {
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
export function selfReportHolds(
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
export function newFindingsSince(
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

export function findingHolds(
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
