import { describe, expect, it } from 'vitest';
import type { Actor, Membership } from '../actor';
import {
	decideDocumentAccess,
	decideUpload,
	documentSide,
	mayDownloadLetter,
	mayEditDocument,
	type DocumentReferral
} from './policy';

// Seamwell's own sharing rules (DESIGN.md, "Consent to share" and "Assessment"): the clinic
// keeps its documents; the studio sees those marked shareable while consent with `documents`
// lasts; nobody else learns they exist.

const member = (organisationId: string, kind: Membership['kind'], role: Membership['role']) => ({
	organisationId,
	organisationName: organisationId,
	kind,
	role
});
const actor = (...memberships: Membership[]): Actor => ({
	userId: 'u',
	email: 'u@test.example',
	name: 'U',
	memberships,
	clientId: null,
	activeOrganisationId: memberships[0]?.organisationId ?? null
});

const physio = actor(member('clinic', 'clinic', 'physiotherapist'));
const otherPhysio = actor(member('other-clinic', 'clinic', 'physiotherapist'));
const clinicAdmin = actor(member('clinic', 'clinic', 'admin'));
const instructor = actor(member('studio', 'studio', 'instructor'));
const otherInstructor = actor(member('other-studio', 'studio', 'instructor'));

const referral = (
	state: DocumentReferral['state'],
	sent = state !== 'draft'
): DocumentReferral => ({
	studioId: 'studio',
	clinicId: 'clinic',
	state,
	sentAt: sent ? new Date('2026-01-05T10:00:00Z') : null
});

describe('documentSide', () => {
	it('places the clinic’s physiotherapists and the studio’s instructors, nobody else', () => {
		expect(documentSide(physio, referral('accepted'))).toBe('clinic');
		expect(documentSide(instructor, referral('accepted'))).toBe('studio');
		for (const other of [otherPhysio, otherInstructor, clinicAdmin]) {
			expect(documentSide(other, referral('accepted'))).toBeNull();
		}
	});

	it('keeps the clinic out of a referral never sent to it', () => {
		expect(documentSide(physio, referral('draft'))).toBeNull();
		expect(documentSide(physio, referral('withdrawn', false))).toBeNull();
		expect(documentSide(physio, referral('withdrawn', true))).toBe('clinic');
	});
});

describe('decideUpload', () => {
	it('lets the clinic add documents to an accepted or assessed referral only', () => {
		expect(decideUpload(physio, referral('accepted')).kind).toBe('allowed');
		expect(decideUpload(physio, referral('assessed')).kind).toBe('allowed');
		for (const state of ['sent', 'declined', 'closed', 'withdrawn'] as const) {
			expect(decideUpload(physio, referral(state)).kind).toBe('wrong-state');
		}
		expect(decideUpload(instructor, referral('accepted')).kind).toBe('not-clinic');
		expect(decideUpload(otherPhysio, referral('accepted')).kind).toBe('hidden');
	});
});

describe('decideDocumentAccess', () => {
	const accepted = referral('accepted');
	it('the clinic always reaches its own documents', () => {
		expect(decideDocumentAccess(physio, accepted, { share: 'clinic' }, false)).toEqual({
			kind: 'allowed',
			side: 'clinic'
		});
	});

	it('the studio reaches a shareable one while consent lasts, and is told when it ended', () => {
		expect(decideDocumentAccess(instructor, accepted, { share: 'studio' }, true).kind).toBe(
			'allowed'
		);
		expect(decideDocumentAccess(instructor, accepted, { share: 'studio' }, false).kind).toBe(
			'sharing-ended'
		);
	});

	it('a clinic-only document, or anyone else, is hidden (404)', () => {
		expect(decideDocumentAccess(instructor, accepted, { share: 'clinic' }, true).kind).toBe(
			'hidden'
		);
		expect(decideDocumentAccess(otherPhysio, accepted, { share: 'studio' }, true).kind).toBe(
			'hidden'
		);
		expect(decideDocumentAccess(otherInstructor, accepted, { share: 'studio' }, true).kind).toBe(
			'hidden'
		);
	});
});

describe('editing and the letter', () => {
	it('only the clinic edits; either side downloads the letter once sent', () => {
		expect(mayEditDocument(physio, referral('accepted'))).toBe(true);
		expect(mayEditDocument(instructor, referral('accepted'))).toBe(false);
		expect(mayDownloadLetter(instructor, referral('sent'))).toBe(true);
		expect(mayDownloadLetter(physio, referral('sent'))).toBe(true);
		expect(mayDownloadLetter(instructor, referral('draft'))).toBe(false);
		expect(mayDownloadLetter(otherPhysio, referral('sent'))).toBe(false);
	});
});
