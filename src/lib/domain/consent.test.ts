import { describe, expect, it } from 'vitest';
import {
	anyConsentCovers,
	consentCovers,
	consentStatus,
	normaliseScopes,
	SCOPE_DIRECTION,
	SCOPE_MEANING,
	SHARE_SCOPES,
	sharingEndedAt,
	type ConsentGrant
} from './consent';

const at = (iso: string) => new Date(iso);
const grant = (over: Partial<ConsentGrant> = {}): ConsentGrant => ({
	scopes: ['referral', 'screenings'],
	startsAt: at('2025-03-01T10:00:00Z'),
	endsAt: null,
	withdrawnAt: null,
	...over
});

describe('scopes', () => {
	it('flow studio → clinic for referral and screenings, clinic → studio for clearance and documents', () => {
		// Seamwell's own product rule (DESIGN.md, "Consent to share"), no outside source.
		expect(SCOPE_DIRECTION).toEqual({
			referral: 'studio_to_clinic',
			screenings: 'studio_to_clinic',
			clearance: 'clinic_to_studio',
			documents: 'clinic_to_studio'
		});
	});

	it('each has plain words for the consent page', () => {
		for (const scope of SHARE_SCOPES) {
			expect(SCOPE_MEANING[scope].title.length).toBeGreaterThan(0);
			expect(SCOPE_MEANING[scope].text.length).toBeGreaterThan(20);
		}
	});

	it('normalise to the list order, each once', () => {
		expect(normaliseScopes(['documents', 'referral', 'documents'])).toEqual([
			'referral',
			'documents'
		]);
	});
});

describe('consentStatus', () => {
	it('is active from the start (inclusive) until the end (exclusive)', () => {
		const g = grant({ endsAt: at('2025-06-01T00:00:00Z') });
		expect(consentStatus(g, at('2025-03-01T09:59:59Z'))).toBe('not_started');
		expect(consentStatus(g, at('2025-03-01T10:00:00Z'))).toBe('active');
		expect(consentStatus(g, at('2025-05-31T23:59:59Z'))).toBe('active');
		expect(consentStatus(g, at('2025-06-01T00:00:00Z'))).toBe('ended');
	});

	it('is withdrawn from the moment of withdrawal, whatever the end date', () => {
		// GDPR Art. 7(3): consent can be withdrawn at any time.
		const g = grant({
			endsAt: at('2026-01-01T00:00:00Z'),
			withdrawnAt: at('2025-04-01T08:00:00Z')
		});
		expect(consentStatus(g, at('2025-04-01T07:59:59Z'))).toBe('active');
		expect(consentStatus(g, at('2025-04-01T08:00:00Z'))).toBe('withdrawn');
	});
});

describe('consentCovers', () => {
	const now = at('2025-04-01T12:00:00Z');
	it('needs every scope asked for', () => {
		expect(consentCovers(grant(), ['referral', 'screenings'], now)).toBe(true);
		expect(consentCovers(grant({ scopes: ['referral'] }), ['referral', 'screenings'], now)).toBe(
			false
		);
	});
	it('refuses a withdrawn or ended grant even with the scopes', () => {
		expect(
			consentCovers(grant({ withdrawnAt: at('2025-03-15T00:00:00Z') }), ['referral'], now)
		).toBe(false);
		expect(consentCovers(grant({ endsAt: at('2025-03-31T00:00:00Z') }), ['referral'], now)).toBe(
			false
		);
	});
	it('does not add scopes across grants: one grant must cover them all', () => {
		const grants = [grant({ scopes: ['referral'] }), grant({ scopes: ['screenings'] })];
		expect(anyConsentCovers(grants, ['referral', 'screenings'], now)).toBe(false);
		expect(anyConsentCovers(grants, ['screenings'], now)).toBe(true);
	});
});

describe('sharingEndedAt', () => {
	const now = at('2025-09-01T00:00:00Z');
	it('is null while the grant holds', () => {
		expect(sharingEndedAt(grant(), now)).toBeNull();
	});
	it('is the withdrawal time, or the earlier end', () => {
		expect(sharingEndedAt(grant({ withdrawnAt: at('2025-05-01T00:00:00Z') }), now)).toEqual(
			at('2025-05-01T00:00:00Z')
		);
		expect(
			sharingEndedAt(
				grant({ endsAt: at('2025-04-01T00:00:00Z'), withdrawnAt: at('2025-05-01T00:00:00Z') }),
				now
			)
		).toEqual(at('2025-04-01T00:00:00Z'));
	});
	it('is the end date for a grant that ran out', () => {
		expect(sharingEndedAt(grant({ endsAt: at('2025-08-01T00:00:00Z') }), now)).toEqual(
			at('2025-08-01T00:00:00Z')
		);
	});
});
