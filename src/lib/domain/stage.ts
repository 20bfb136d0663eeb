import { SOURCES } from './sources';

export const STAGES = ['pregnant', 'postpartum'] as const;
export type Stage = (typeof STAGES)[number];

/** The client's position in care when she was screened. */
export type StageContext =
	| { stage: 'pregnant'; weeksOfGestation?: number }
	| {
			stage: 'postpartum';
			weeksPostpartum?: number;
			/** Whether her postnatal check (about 6–8 weeks) has happened; unknown when absent. */
			postnatalCheckDone?: boolean;
	  };

export type EarlyScreenWarningCode =
	'before_six_weeks' | 'postnatal_check_pending' | 'weeks_postpartum_unknown';

export interface EarlyScreenWarning {
	code: EarlyScreenWarningCode;
	message: string;
	source: string;
}

/**
 * Six weeks after the birth: before it a gap is common and often still closing, and the
 * postnatal check (about 6–8 weeks) has not yet happened (UK CMO 2019 via NHS pages).
 */
export const EARLY_SCREEN_WEEKS = 6;

/**
 * Cautions to show beside a postpartum screening taken early or before the postnatal check.
 * They never change the outcome: an early screen still records and classifies what was felt.
 */
export function earlyScreenWarnings(context: StageContext): EarlyScreenWarning[] {
	if (context.stage !== 'postpartum') return [];
	const warnings: EarlyScreenWarning[] = [];
	const weeks = context.weeksPostpartum;
	if (weeks === undefined) {
		warnings.push({
			code: 'weeks_postpartum_unknown',
			message:
				'Weeks since the birth are not recorded, so it is not known whether this is an early screen.',
			source: SOURCES.postnatalCheck
		});
	} else if (weeks < EARLY_SCREEN_WEEKS) {
		warnings.push({
			code: 'before_six_weeks',
			message: `Screened ${weeks} ${weeks === 1 ? 'week' : 'weeks'} after the birth, before 6 weeks: a gap is common this early and often still closing. Screen again after the postnatal check.`,
			source: `${SOURCES.postnatalCheck}; ${SOURCES.sperstad2016Prevalence}`
		});
	}
	if (context.postnatalCheckDone === false) {
		warnings.push({
			code: 'postnatal_check_pending',
			message:
				'Her postnatal check has not happened yet: it comes before building intensity, so keep to gentle work until it has.',
			source: SOURCES.postnatalCheck
		});
	}
	return warnings;
}
