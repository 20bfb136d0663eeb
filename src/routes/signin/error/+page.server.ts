import type { PageServerLoad } from './$types';

const REASONS = ['expired', 'used', 'invalid', 'refused'] as const;

export const load: PageServerLoad = ({ url }) => {
	const asked = url.searchParams.get('reason');
	const reason = REASONS.find((r) => r === asked) ?? 'invalid';
	return { reason };
};
