import type { Outcome } from '$lib/domain/screening';

export const OUTCOME_LABELS: Record<Outcome, string> = {
	within_limit: 'Within the limit',
	monitor: 'Monitor',
	refer: 'Refer'
};
