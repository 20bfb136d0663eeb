import { SPERSTAD_FINGER_WIDTH } from './criteria';
import { RED_FLAG_LABELS, RED_FLAG_STAGES, RED_FLAGS, type RedFlag } from './red-flags';
import { siteLabelCapitalised, SITES, type Site } from './sites';
import { SOURCES } from './sources';
import type { Stage } from './stage';
import { weeksPostpartum } from './weeks';

/**
 * The client's own check between sessions: how she feels (the one symptom list, each symptom
 * with an urgency) and, where it suits her, the finger-width check she does on herself. Her
 * answer is advice in plain words, never a screening outcome: finger-width scores differ
 * between raters (Bursch 1987), so a self-check never enters the trend or the outcome.
 */

/** Most urgent first. */
export const ADVICE_LEVELS = [
	'emergency',
	'same_day',
	'see_clinician',
	'show_instructor',
	'thanks'
] as const;
export type AdviceLevel = (typeof ADVICE_LEVELS)[number];

/** A symptom's own urgency: the first three advice levels. */
export type SymptomUrgency = Extract<AdviceLevel, 'emergency' | 'same_day' | 'see_clinician'>;

export const ADVICE_RANK: Record<AdviceLevel, number> = {
	emergency: 0,
	same_day: 1,
	see_clinician: 2,
	show_instructor: 3,
	thanks: 4
};

/**
 * How soon each symptom needs a clinician. Emergency and same-day signs follow NICE CG37's
 * postnatal signs (verified) and ACOG Committee Opinion 804 (from memory); the rest are the
 * physiotherapist's (Goom et al. 2019, secondary). Where a sign is in neither, common practice.
 */
export const SYMPTOM_URGENCY: Record<RedFlag, SymptomUrgency> = {
	heavy_bleeding: 'emergency',
	chest_pain: 'emergency',
	breathless_before_effort: 'emergency',
	fluid_leaking: 'emergency',
	painful_contractions: 'emergency',
	reduced_fetal_movements: 'emergency',
	stuck_bulge: 'emergency',
	calf_pain_swelling: 'same_day',
	headache: 'same_day',
	wound_infection: 'same_day',
	dizziness: 'same_day',
	vaginal_bleeding: 'same_day',
	muscle_weakness: 'same_day',
	scar_pain: 'same_day',
	scar_bulge: 'same_day',
	pelvic_heaviness: 'see_clinician',
	leakage: 'see_clinician',
	midline_bulge: 'see_clinician',
	back_pain: 'see_clinician',
	pelvic_pain: 'see_clinician',
	late_bleeding: 'see_clinician',
	pain_on_effort: 'see_clinician'
};

/** Where each urgency comes from, per symptom. */
export const SYMPTOM_URGENCY_SOURCES: Record<RedFlag, string> = {
	heavy_bleeding: SOURCES.niceCg37LifeThreatening,
	chest_pain: `${SOURCES.niceCg37LifeThreatening}; ${SOURCES.acog804}`,
	breathless_before_effort: `${SOURCES.niceCg37LifeThreatening}; ${SOURCES.acog804}`,
	fluid_leaking: SOURCES.acog804,
	painful_contractions: SOURCES.acog804,
	reduced_fetal_movements: SOURCES.fetalMovementsPractice,
	stuck_bulge: SOURCES.stuckBulgePractice,
	calf_pain_swelling: `${SOURCES.niceCg37}; ${SOURCES.acog804}`,
	headache: `${SOURCES.niceCg37}; ${SOURCES.acog804}`,
	wound_infection: `${SOURCES.niceCg37}; ${SOURCES.caesareanScarSigns}`,
	dizziness: `${SOURCES.acog804}; ${SOURCES.selfCheckUrgencyPractice}`,
	vaginal_bleeding: `${SOURCES.acog804}; ${SOURCES.selfCheckUrgencyPractice}`,
	muscle_weakness: `${SOURCES.acog804}; ${SOURCES.selfCheckUrgencyPractice}`,
	scar_pain: `${SOURCES.caesareanScarSigns}; ${SOURCES.selfCheckUrgencyPractice}`,
	scar_bulge: `${SOURCES.caesareanScarSigns}; ${SOURCES.selfCheckUrgencyPractice}`,
	pelvic_heaviness: SOURCES.goom2019RedFlags,
	leakage: SOURCES.goom2019RedFlags,
	midline_bulge: SOURCES.goom2019RedFlags,
	back_pain: SOURCES.goom2019RedFlags,
	pelvic_pain: SOURCES.goom2019RedFlags,
	late_bleeding: SOURCES.goom2019RedFlags,
	pain_on_effort: SOURCES.painPractice
};

/**
 * Signs NICE CG37 lists after the birth that the screening form offers only in pregnancy: the
 * self-check offers them after the birth too, since she may feel them at home.
 */
const POSTNATAL_SELF_CHECK_EXTRAS: readonly RedFlag[] = [
	'chest_pain',
	'breathless_before_effort',
	'headache',
	'calf_pain_swelling',
	'dizziness'
];

/** The symptoms the self-check lists for her stage, most urgent first. */
export function selfCheckSymptoms(stage: Stage): RedFlag[] {
	const offered = RED_FLAGS.filter(
		(flag) =>
			RED_FLAG_STAGES[flag].includes(stage) ||
			(stage === 'postpartum' && POSTNATAL_SELF_CHECK_EXTRAS.includes(flag))
	);
	return offered.sort((a, b) => ADVICE_RANK[SYMPTOM_URGENCY[a]] - ADVICE_RANK[SYMPTOM_URGENCY[b]]);
}

/** What she felt at one place: finger widths (0–6, half steps), deep or not, doming. */
export interface SelfCheckSite {
	widthFingers: number;
	deep: boolean;
	doming: boolean;
}

export type SelfCheckSites = Record<Site, SelfCheckSite>;

export interface SelfCheckInput {
	symptoms: readonly RedFlag[];
	sites?: SelfCheckSites | null;
}

export interface SelfCheckAdvice {
	level: AdviceLevel;
	/** Plain words for her; always ends with WHO_SEES_IT. */
	text: string;
	/** The symptoms or findings that decided the level. */
	because: string[];
	sources: string[];
}

export const WHO_SEES_IT =
	'Your instructor sees this later, not live — if you are worried, don’t wait: contact your midwife, doctor or physiotherapist.';

const LEVEL_WORDS: Record<AdviceLevel, string> = {
	emergency:
		'Please call emergency services or go to the nearest emergency department now. Don’t exercise.',
	same_day:
		'Please contact your midwife or doctor today. Rest from exercise until you have spoken to them.',
	see_clinician:
		'Please book to see a pelvic-health physiotherapist or your doctor soon. Until then, pause heavy lifting, breath-holding effort and impact work; gentle breathing and deep-core work are fine if they feel comfortable.',
	show_instructor:
		'Thank you. What you felt is worth showing your instructor at your next session, so she can check it with you and adjust your exercises.',
	thanks: 'Thank you. Nothing you noted needs action now; keep going with your practice.'
};

/** Sperstad 2016's two finger widths, the trade's rule of thumb. */
export const SELF_CHECK_WIDTH_THRESHOLD = SPERSTAD_FINGER_WIDTH.value;

/**
 * Plain-words advice for one self-check: the most urgent symptom decides; without one, two
 * finger widths or more at any place (Sperstad 2016, the trade's rule of thumb), a deep gap
 * (Lee & Hodges 2016) or doming (common practice) is worth showing her instructor; otherwise
 * thanks. Her finger widths never change a limit.
 */
export function selfCheckAdvice(input: SelfCheckInput): SelfCheckAdvice {
	let level: AdviceLevel = 'thanks';
	const because: string[] = [];
	const sources = new Set<string>();
	for (const symptom of input.symptoms) {
		const urgency = SYMPTOM_URGENCY[symptom];
		if (ADVICE_RANK[urgency] < ADVICE_RANK[level]) level = urgency;
	}
	for (const symptom of input.symptoms) {
		if (SYMPTOM_URGENCY[symptom] !== level) continue;
		because.push(RED_FLAG_LABELS[symptom]);
		for (const source of SYMPTOM_URGENCY_SOURCES[symptom].split('; ')) sources.add(source);
	}
	if (level === 'thanks' && input.sites) {
		for (const site of SITES) {
			const felt = input.sites[site];
			if (felt.widthFingers >= SELF_CHECK_WIDTH_THRESHOLD) {
				because.push(`${siteLabelCapitalised(site)}: ${felt.widthFingers} finger widths or more`);
				sources.add(SOURCES.sperstad2016);
			}
			if (felt.deep) {
				because.push(`${siteLabelCapitalised(site)}: deep`);
				sources.add(SOURCES.deepOrSoftPractice);
			}
			if (felt.doming) {
				because.push(`${siteLabelCapitalised(site)}: doming`);
				sources.add(SOURCES.domingPractice);
			}
		}
		if (because.length > 0) level = 'show_instructor';
	}
	return {
		level,
		text: `${LEVEL_WORDS[level]} ${WHO_SEES_IT}`,
		because,
		sources: [...sources]
	};
}

/** She is at or past this many weeks after the birth before the finger-width part is offered. */
export const SELF_CHECK_FROM_WEEKS = 6;

export interface FingerCheckOfferInput {
	stage: Stage;
	birthDate: string | null;
	delivery: 'vaginal' | 'caesarean' | null;
	/** Her own answer: is the caesarean wound healed? Null when not asked yet. */
	woundHealed: boolean | null;
}

export type FingerCheckOffer =
	| { offered: true }
	| {
			offered: false;
			why: 'pregnant' | 'too_early' | 'birth_unknown' | 'wound_healing' | 'ask_wound';
			text: string;
			source: string;
	  };

/**
 * Whether the finger-width part is offered today: not in pregnancy (a wide gap is expected,
 * Mota 2015), not before 6 weeks after the birth (the postnatal check comes first), not while a
 * caesarean wound is still healing (she is asked). The symptom check is always offered.
 */
export function fingerCheckOffer(input: FingerCheckOfferInput, today: string): FingerCheckOffer {
	if (input.stage === 'pregnant') {
		return {
			offered: false,
			why: 'pregnant',
			text: 'In pregnancy a gap along the midline is expected as the baby grows, so there is nothing to measure yourself. The symptom check is always here.',
			source: SOURCES.mota2015
		};
	}
	if (!input.birthDate || input.birthDate > today) {
		return {
			offered: false,
			why: 'birth_unknown',
			text: 'Your studio has not recorded your baby’s birth date, so Seamwell cannot tell whether you are past 6 weeks. Ask your instructor to add it.',
			source: SOURCES.postnatalCheck
		};
	}
	if (weeksPostpartum(input.birthDate, today) < SELF_CHECK_FROM_WEEKS) {
		return {
			offered: false,
			why: 'too_early',
			text: 'The finger-width check is for 6 weeks after the birth onwards, after your postnatal check.',
			source: SOURCES.postnatalCheck
		};
	}
	if (input.delivery !== 'vaginal') {
		if (input.woundHealed === null) {
			return {
				offered: false,
				why: 'ask_wound',
				text: 'Is your caesarean wound fully healed — closed, dry and not sore to touch?',
				source: SOURCES.caesareanPractice
			};
		}
		if (!input.woundHealed) {
			return {
				offered: false,
				why: 'wound_healing',
				text: 'While your caesarean wound is still healing, leave the finger-width check. Your midwife or doctor can tell you when it has healed.',
				source: SOURCES.caesareanPractice
			};
		}
	}
	return { offered: true };
}

/** The self-reported symptoms that hold movement: `see_clinician` or above. */
export function holdingSymptoms(symptoms: readonly RedFlag[]): RedFlag[] {
	return symptoms.filter(
		(symptom) => ADVICE_RANK[SYMPTOM_URGENCY[symptom]] <= ADVICE_RANK.see_clinician
	);
}
