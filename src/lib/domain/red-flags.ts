import { SOURCES } from './sources';
import type { Stage } from './stage';

/**
 * Symptoms that call for a referral whatever the width. Codes are our own; the list follows
 * the postnatal red flags restated from Goom et al. 2019, plus pain on effort (common practice).
 */
export const SYMPTOM_RED_FLAGS = [
	'pelvic_heaviness',
	'leakage',
	'midline_bulge',
	'back_pain',
	'pelvic_pain',
	'late_bleeding',
	'pain_on_effort'
] as const;

/**
 * Warning signs to stop exercise in pregnancy and seek medical care, recalled from ACOG
 * Committee Opinion 804 (2020) — from memory, not verified against the text. Codes are our own.
 */
export const PREGNANCY_WARNING_SIGNS = [
	'vaginal_bleeding',
	'fluid_leaking',
	'painful_contractions',
	'dizziness',
	'chest_pain',
	'breathless_before_effort',
	'headache',
	'calf_pain_swelling',
	'muscle_weakness'
] as const;

/**
 * Signs at a caesarean wound that send her to a doctor (common practice, from memory — not
 * verified). Codes are our own.
 */
export const CAESAREAN_SCAR_SIGNS = ['scar_pain', 'scar_bulge', 'wound_infection'] as const;

/**
 * Signs that need emergency care now, added when the list became the one symptom list of the
 * screening form and the client's self-check: heavy bleeding (NICE CG37, table 5-1), reduced
 * fetal movements and a hard painful bulge that will not go back in (common practice, from
 * memory). Codes are our own.
 */
export const EMERGENCY_SIGNS = [
	'heavy_bleeding',
	'reduced_fetal_movements',
	'stuck_bulge'
] as const;

export const RED_FLAGS = [
	...SYMPTOM_RED_FLAGS,
	...PREGNANCY_WARNING_SIGNS,
	...CAESAREAN_SCAR_SIGNS,
	...EMERGENCY_SIGNS
] as const;
export type RedFlag = (typeof RED_FLAGS)[number];

export const RED_FLAG_LABELS: Record<RedFlag, string> = {
	pelvic_heaviness: 'Pelvic heaviness or dragging',
	leakage: 'Leaking urine, wind or stool, or urgency',
	midline_bulge: 'A bulge or lump along the midline or at the navel',
	back_pain: 'New or worse low back pain',
	pelvic_pain: 'New or worse pelvic pain',
	late_bleeding: 'Bleeding more than 8 weeks after the birth',
	pain_on_effort: 'Pain in the belly on effort',
	vaginal_bleeding: 'Vaginal bleeding',
	fluid_leaking: 'Fluid leaking from the vagina',
	painful_contractions: 'Regular painful contractions',
	dizziness: 'Dizziness or feeling faint',
	chest_pain: 'Chest pain',
	breathless_before_effort: 'Short of breath before any effort',
	headache: 'Headache',
	calf_pain_swelling: 'Calf pain or swelling',
	muscle_weakness: 'Muscle weakness affecting balance',
	scar_pain: 'Pain at the caesarean scar',
	scar_bulge: 'A bulge or lump at the caesarean scar',
	wound_infection: 'Signs of wound infection: redness, heat, discharge or fever',
	heavy_bleeding: 'Heavy bleeding or passing clots',
	reduced_fetal_movements: 'The baby moving less than usual',
	stuck_bulge: 'A hard, painful bulge that will not go back in'
};

const BOTH: readonly Stage[] = ['pregnant', 'postpartum'];

/**
 * Which flags the screening form offers in each stage. Late bleeding only has a meaning after
 * the birth; the pregnancy warning signs are the list for pregnancy. Classification never drops
 * a flag recorded outside its stage: a recorded symptom always counts.
 */
export const RED_FLAG_STAGES: Record<RedFlag, readonly Stage[]> = {
	pelvic_heaviness: BOTH,
	leakage: BOTH,
	midline_bulge: BOTH,
	back_pain: BOTH,
	pelvic_pain: BOTH,
	late_bleeding: ['postpartum'],
	pain_on_effort: BOTH,
	vaginal_bleeding: ['pregnant'],
	fluid_leaking: ['pregnant'],
	painful_contractions: ['pregnant'],
	dizziness: ['pregnant'],
	chest_pain: ['pregnant'],
	breathless_before_effort: ['pregnant'],
	headache: ['pregnant'],
	calf_pain_swelling: ['pregnant'],
	muscle_weakness: ['pregnant'],
	scar_pain: ['postpartum'],
	scar_bulge: ['postpartum'],
	wound_infection: ['postpartum'],
	heavy_bleeding: BOTH,
	reduced_fetal_movements: ['pregnant'],
	stuck_bulge: BOTH
};

export function redFlagsForStage(stage: Stage): RedFlag[] {
	return RED_FLAGS.filter((flag) => RED_FLAG_STAGES[flag].includes(stage));
}

export type ReferTo = 'physio' | 'medical';

/**
 * Whom each flag sends the client to on its own. Bleeding late after the birth, every
 * pregnancy warning sign and every caesarean scar sign go to a doctor; the rest are a pelvic-health physiotherapist's work.
 * A midline bulge goes to a doctor when it hurts (see PAIN_FLAGS and classifyScreening).
 */
export const RED_FLAG_REFER_TO: Record<RedFlag, ReferTo> = {
	pelvic_heaviness: 'physio',
	leakage: 'physio',
	midline_bulge: 'physio',
	back_pain: 'physio',
	pelvic_pain: 'physio',
	late_bleeding: 'medical',
	pain_on_effort: 'physio',
	vaginal_bleeding: 'medical',
	fluid_leaking: 'medical',
	painful_contractions: 'medical',
	dizziness: 'medical',
	chest_pain: 'medical',
	breathless_before_effort: 'medical',
	headache: 'medical',
	calf_pain_swelling: 'medical',
	muscle_weakness: 'medical',
	scar_pain: 'medical',
	scar_bulge: 'medical',
	wound_infection: 'medical',
	heavy_bleeding: 'medical',
	reduced_fetal_movements: 'medical',
	stuck_bulge: 'medical'
};

/** Flags that make a midline bulge count as painful. */
export const PAIN_FLAGS: readonly RedFlag[] = ['pain_on_effort', 'pelvic_pain', 'back_pain'];

// Built in a call marked pure so that a page needing only the labels leaves it out, and the
// sources table with it: the bundler keeps every top-level read of a SOURCES field.
export const RED_FLAG_SOURCES: Record<RedFlag, string> = /* @__PURE__ */ (() => ({
	pelvic_heaviness: SOURCES.goom2019RedFlags,
	leakage: SOURCES.goom2019RedFlags,
	midline_bulge: SOURCES.goom2019RedFlags,
	back_pain: SOURCES.goom2019RedFlags,
	pelvic_pain: SOURCES.goom2019RedFlags,
	late_bleeding: SOURCES.goom2019RedFlags,
	pain_on_effort: SOURCES.painPractice,
	vaginal_bleeding: SOURCES.acog804,
	fluid_leaking: SOURCES.acog804,
	painful_contractions: SOURCES.acog804,
	dizziness: SOURCES.acog804,
	chest_pain: SOURCES.acog804,
	breathless_before_effort: SOURCES.acog804,
	headache: SOURCES.acog804,
	calf_pain_swelling: SOURCES.acog804,
	muscle_weakness: SOURCES.acog804,
	scar_pain: SOURCES.caesareanScarSigns,
	scar_bulge: SOURCES.caesareanScarSigns,
	wound_infection: SOURCES.caesareanScarSigns,
	heavy_bleeding: SOURCES.niceCg37LifeThreatening,
	reduced_fetal_movements: SOURCES.fetalMovementsPractice,
	stuck_bulge: SOURCES.stuckBulgePractice
}))();

export function isRedFlag(value: string): value is RedFlag {
	return (RED_FLAGS as readonly string[]).includes(value);
}

export function isPregnancyWarningSign(flag: RedFlag): boolean {
	return (PREGNANCY_WARNING_SIGNS as readonly RedFlag[]).includes(flag);
}

export function isCaesareanScarSign(flag: RedFlag): boolean {
	return (CAESAREAN_SCAR_SIGNS as readonly RedFlag[]).includes(flag);
}
