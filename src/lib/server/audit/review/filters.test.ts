import { describe, expect, it } from 'vitest';
import { reviewQuery, timeRange } from './filters';

// Bad input names the parameter (422 pointers come from these issue paths).
const pathsOf = (input: Record<string, string>) => {
	const parsed = reviewQuery.safeParse(input);
	return parsed.success ? [] : parsed.error.issues.map((i) => i.path.join('.'));
};

describe('access-log filters', () => {
	it.each([
		[{ from: '2026-13-40' }, 'from'],
		[{ to: 'yesterday' }, 'to'],
		[{ from: '2026-12-02', to: '2026-12-01' }, 'from'],
		[{ action: 'client.eaten' }, 'action'],
		[{ outcome: 'maybe' }, 'outcome'],
		[{ limit: '0' }, 'limit'],
		[{ limit: '201' }, 'limit'],
		[{ limit: 'ten' }, 'limit'],
		[{ actor: 'not-a-uuid' }, 'actor'],
		[{ client: '42' }, 'client'],
		[{ target: 'no colon' }, 'target']
	])('%j is refused, naming %s', (input, name) => {
		expect(pathsOf(input)).toEqual([name]);
	});

	it('empty parameters (an untouched form field) mean no filter', () => {
		expect(reviewQuery.parse({ actor: '', action: '', from: '', limit: '' })).toEqual({
			limit: 50
		});
	});

	it('a day in `to` counts whole; the same day in both is one day', () => {
		expect(timeRange({ from: '2026-12-01', to: '2026-12-01' })).toEqual({
			from: new Date('2026-12-01T00:00:00Z'),
			before: new Date('2026-12-02T00:00:00Z')
		});
		expect(reviewQuery.safeParse({ from: '2026-12-01', to: '2026-12-01' }).success).toBe(true);
	});

	it('takes ISO times with an offset', () => {
		expect(timeRange({ from: '2026-12-01T10:00:00+01:00' }).from).toEqual(
			new Date('2026-12-01T09:00:00Z')
		);
	});
});
