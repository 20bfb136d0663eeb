import {
	compareAssessment,
	detectableChange,
	type AssessmentComparisons as PointsAndHernia,
	type WidthChange
} from '../../domain/assessment';
import type { AssessmentView } from './assessment';

// The published comparisons of an assessment (src/lib/domain/assessment.ts): each point
// against the criteria of its own state, method and point, the EHS and Reinpold grades above
// 2 cm, the hernia pathway, and each width's change since the assessment before — every one
// naming its criterion and source.

export interface AssessmentComparisons extends PointsAndHernia {
	/** Changes since the previous assessment, point by point (ultrasound at the same point). */
	changes: Array<WidthChange & { label: string }>;
}

export function compareAssessments(
	current: AssessmentView,
	previous: AssessmentView | null
): AssessmentComparisons {
	const compared = compareAssessment(current);
	const changes: AssessmentComparisons['changes'] = [];
	if (previous) {
		for (const now of compared.points) {
			for (const before of previous.points) {
				for (const change of detectableChange(before, now.point)) {
					changes.push({ ...change, label: now.label });
				}
			}
		}
	}
	return { ...compared, changes };
}
