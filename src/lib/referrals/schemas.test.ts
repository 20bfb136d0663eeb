import { describe, expect, it } from 'vitest';
import {
	giveConsentSchema,
	openReferralSchema,
	referralFilterSchema,
	transitionSchema
} from './schemas';

// Bad input is refused at the edge, naming the field (the API turns paths into pointers).

const ID = '6f1c2a4e-8b7d-4c3e-9a21-0d5e7f9b1c33';
const paths = (result: { success: boolean; error?: { issues: Array<{ path: PropertyKey[] }> } }) =>
	result.error?.issues.map((i) => i.path.join('.')) ?? [];

describe('openReferralSchema', () => {
	const good = { clientId: ID, clinicId: ID, reason: 'Wide gap at the navel', urgency: 'soon' };
	it('accepts a complete draft, trimming the reason and defaulting red flags', () => {
		const parsed = openReferralSchema.parse({ ...good, reason: '  Wide gap  ' });
		expect(parsed).toMatchObject({ reason: 'Wide gap', redFlags: [] });
	});
	it('names an unknown urgency, an empty reason and an unknown red flag', () => {
		expect(paths(openReferralSchema.safeParse({ ...good, urgency: 'urgent' }))).toEqual([
			'urgency'
		]);
		expect(paths(openReferralSchema.safeParse({ ...good, reason: '   ' }))).toEqual(['reason']);
		expect(paths(openReferralSchema.safeParse({ ...good, redFlags: ['tired'] }))).toEqual([
			'redFlags.0'
		]);
		expect(paths(openReferralSchema.safeParse({ ...good, clinicId: 'clinic-1' }))).toEqual([
			'clinicId'
		]);
	});
	it('refuses NUL characters, which PostgreSQL cannot store', () => {
		expect(paths(openReferralSchema.safeParse({ ...good, reason: 'a\u0000b' }))).toEqual([
			'reason'
		]);
	});
});

describe('giveConsentSchema', () => {
	it('names scopes outside the list, and an empty list', () => {
		expect(
			paths(giveConsentSchema.safeParse({ clinicId: ID, scopes: ['referral', 'photos'] }))
		).toEqual(['scopes.1']);
		expect(paths(giveConsentSchema.safeParse({ clinicId: ID, scopes: [] }))).toEqual(['scopes']);
	});
	it('reads a day as the start of that day, UTC', () => {
		const parsed = giveConsentSchema.parse({
			clinicId: ID,
			scopes: ['referral'],
			endsAt: '2030-01-31'
		});
		expect(parsed.endsAt?.toISOString()).toBe('2030-01-31T00:00:00.000Z');
	});
});

describe('transitionSchema', () => {
	it('takes only states a move can lead to, and an empty reason as none', () => {
		expect(paths(transitionSchema.safeParse({ to: 'draft' }))).toEqual(['to']);
		expect(transitionSchema.parse({ to: 'declined', reason: '  ' }).reason).toBeNull();
		expect(transitionSchema.parse({ to: 'accepted' }).reason).toBeNull();
	});
});

describe('referralFilterSchema', () => {
	it('reads several states, comma-separated, and refuses unknown ones', () => {
		expect(referralFilterSchema.parse({ state: 'sent,accepted' }).state).toEqual([
			'sent',
			'accepted'
		]);
		expect(referralFilterSchema.parse({}).state).toEqual([]);
		expect(referralFilterSchema.safeParse({ state: 'sent,lost' }).success).toBe(false);
	});
});
