import type { AssessmentView } from './assessment';

// The published comparisons of an assessment's widths (src/lib/domain/assessment.ts): each
// point against the criteria of its own state, method and point, the EHS and Reinpold grades
// above 2 cm, the hernia pathway, and what changed since the assessment before.

export interface AssessmentComparisons {
	points: unknown[];
	changes: unknown[];
}

export function compareAssessments(
	_current: AssessmentView,
	_previous: AssessmentView | null
): AssessmentComparisons | null {
	// The domain's comparison functions are not in yet: nothing is compared, nothing is shown.
	return null;
}
