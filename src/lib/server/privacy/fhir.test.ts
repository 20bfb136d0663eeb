import { Fhir } from 'fhir';
import { describe, expect, it } from 'vitest';
import { REFERRAL_STATES } from '$lib/domain/referral';
import type { ClientDetail, ScreeningView } from '$lib/clients/types';
import type { ConsentGrantView } from '../consents/service';
import type { ClientReferral } from '../referrals/for-client';
import type { ReferralDetail } from '$lib/referrals/types';
import type { DocumentItem } from '../documents/service';
import {
	buildClientBundle,
	buildReferralBundle,
	CONSENT_STATUS,
	SERVICE_REQUEST_STATUS,
	TASK_STATUS,
	type FhirBundle
} from './fhir';

// The client's FHIR R4 Bundle on fixed, invented inputs, validated offline by the `fhir`
// package against HL7's R4 StructureDefinitions; invariants it does not check (Consent ppc-1,
// references resolving inside the Bundle) are asserted here. Allowed codes: HL7 FHIR R4 4.0.1
// (REFERENCES.md "Open standards": request-status, consent-state-codes, request-intent).

const ORIGIN = 'https://seamwell.example';
const fhir = new Fhir();

const client = {
	id: '6f1c3b1e-0d4a-4c53-9a53-3f0f4c1f6a01',
	name: 'Ada Invented',
	email: 'ada@example.test',
	stage: 'postpartum'
} as ClientDetail;

const screening = {
	id: '0b7d8f3e-1c2a-4e5b-8f6a-7c8d9e0f1a2b',
	takenAt: '2026-11-20T09:30:00.000Z',
	sites: {
		above_navel: { widthFingers: 1.5, depth: 'shallow', tension: 'firm', doming: false },
		at_navel: { widthFingers: 2.5, widthMm: 24, depth: 'deep', tension: 'soft', doming: true },
		below_navel: { widthFingers: 1, depth: 'shallow', tension: 'firm', doming: false }
	}
} as ScreeningView;

const referral = (state: ClientReferral['state'], id: string): ClientReferral => ({
	id,
	state,
	clinicName: 'Invented Pelvic Health',
	physioName: null,
	createdAt: '2026-11-21T10:00:00.000Z',
	sentAt: state === 'draft' ? null : '2026-11-21T10:05:00.000Z',
	changedAt: '2026-11-22T10:00:00.000Z',
	clinicNote: state === 'declined' ? 'Please see your GP first.' : null
});

const grant = (status: ConsentGrantView['status'], id: string) =>
	({
		id,
		clinicName: 'Invented Pelvic Health',
		scopes: ['referral', 'screenings'],
		startsAt: '2026-11-20T00:00:00.000Z',
		endsAt: null,
		withdrawnAt: status === 'withdrawn' ? '2026-11-25T00:00:00.000Z' : null,
		status
	}) as ConsentGrantView;

function bundle(): FhirBundle {
	return buildClientBundle(
		{
			client,
			screenings: [screening],
			referrals: REFERRAL_STATES.map((state, i) =>
				referral(state, `a0000000-0000-4000-8000-00000000000${i}`)
			),
			selfChecks: [
				{
					id: '5e1f0a2b-3c4d-4e5f-8a6b-7c8d9e0f1a2c',
					takenAt: '2026-11-28T08:00:00.000Z',
					symptoms: [],
					sites: {
						above_navel: { widthFingers: 1, deep: false, doming: false },
						at_navel: { widthFingers: 2, deep: true, doming: false },
						below_navel: { widthFingers: 1, deep: false, doming: false }
					},
					advice: { level: 'show_instructor', text: 'invented' },
					selfReported: true
				}
			],
			consents: [
				grant('active', 'c0000000-0000-4000-8000-000000000001'),
				grant('withdrawn', 'c0000000-0000-4000-8000-000000000002')
			],
			documents: [
				{
					id: 'd0000000-0000-4000-8000-0000000000ee',
					name: 'Assessment summary.pdf',
					share: 'studio',
					size: 4096,
					pages: 2,
					uploadedAt: '2026-11-20T09:00:00.000Z',
					uploadedBy: 'Invented Physio',
					summary: null
				}
			]
		},
		ORIGIN,
		new Date('2026-12-01T12:00:00Z')
	);
}

describe('the client’s FHIR R4 Bundle', () => {
	it('validates against the R4 StructureDefinitions', () => {
		const result = fhir.validate(bundle());
		expect(result.messages.filter((m) => m.severity === 'error')).toEqual([]);
		expect(result.valid).toBe(true);
	});

	it('a DocumentReference per document shared with her studio: current, with size, title and download URL', () => {
		const refs = bundle().entry.filter((e) => e.resource.resourceType === 'DocumentReference');
		expect(refs).toHaveLength(1);
		expect(refs[0]!.resource).toMatchObject({
			status: 'current',
			subject: { reference: `Patient/${client.id}` },
			content: [
				{
					attachment: {
						size: 4096,
						title: 'Assessment summary.pdf',
						contentType: 'application/pdf',
						url: `${ORIGIN}/api/v1/documents/d0000000-0000-4000-8000-0000000000ee`
					}
				}
			]
		});
	});

	it('the validator would catch a wrong status (so the check above can fail)', () => {
		const broken = bundle();
		const consent = broken.entry.find((e) => e.resource.resourceType === 'Consent')!;
		consent.resource.status = 'withdrawn';
		expect(fhir.validate(broken).valid).toBe(false);
	});

	it('one Observation per site per screening, finger widths with a UCUM annotation, mm as UCUM mm', () => {
		const observations = bundle().entry.filter((e) => e.resource.resourceType === 'Observation');
		// Three from the instructor's screening, three from her own check, tagged self-reported.
		expect(observations).toHaveLength(6);
		const own = observations.filter((o) =>
			JSON.stringify(o.resource.meta ?? {}).includes('self-reported')
		);
		expect(own).toHaveLength(3);
		const atNavel = observations[1]!.resource as unknown as {
			valueQuantity: unknown;
			component: Array<{ valueQuantity?: unknown }>;
			code: { coding: Array<{ system: string }> };
		};
		expect(atNavel.valueQuantity).toMatchObject({ value: 2.5, code: '{finger-width}' });
		expect(atNavel.component[0]!.valueQuantity).toMatchObject({ value: 24, code: 'mm' });
		expect(atNavel.code.coding[0]!.system).toBe(`${ORIGIN}/fhir/CodeSystem/seamwell`);
	});

	it('every reference resolves inside the Bundle; every Consent has a policyRule (ppc-1)', () => {
		const b = bundle();
		const ids = new Set(b.entry.map((e) => `${e.resource.resourceType}/${e.resource.id}`));
		const references: string[] = [];
		JSON.stringify(b, (key, value: unknown) => {
			if (key === 'reference' && typeof value === 'string') references.push(value);
			return value;
		});
		expect(references.length).toBeGreaterThan(0);
		expect(references.filter((r) => !ids.has(r))).toEqual([]);
		for (const e of b.entry.filter((x) => x.resource.resourceType === 'Consent')) {
			expect(e.resource.policyRule ?? e.resource.policy).toBeTruthy();
		}
	});

	it('maps every referral state; an instructor only proposes (intent proposal)', () => {
		// HL7 FHIR R4 request-status and task-status value sets (REFERENCES.md).
		const requestStatuses = [
			'draft',
			'active',
			'on-hold',
			'revoked',
			'completed',
			'entered-in-error',
			'unknown'
		];
		for (const state of REFERRAL_STATES) {
			expect(requestStatuses).toContain(SERVICE_REQUEST_STATUS[state]);
		}
		expect(SERVICE_REQUEST_STATUS.withdrawn).toBe('revoked');
		expect(TASK_STATUS.declined).toBe('rejected');
		expect(TASK_STATUS.draft).toBeUndefined();
		const requests = bundle().entry.filter((e) => e.resource.resourceType === 'ServiceRequest');
		expect(requests.map((e) => e.resource.intent)).toEqual(REFERRAL_STATES.map(() => 'proposal'));
		// Withdrawal is `inactive`: "withdrawn" is not an R4 Consent status.
		expect(CONSENT_STATUS.withdrawn).toBe('inactive');
	});
});

describe('a referral as a FHIR R4 Bundle for the clinic', () => {
	it('ServiceRequest with reason and priority, Task, Observations and a DocumentReference validate', () => {
		const detail = {
			id: 'a0000000-0000-4000-8000-0000000000aa',
			state: 'accepted',
			clientId: client.id,
			clinicId: 'b0000000-0000-4000-8000-0000000000bb',
			physioId: null,
			urgency: 'soon',
			createdAt: '2026-11-21T10:00:00.000Z',
			sentAt: '2026-11-21T10:05:00.000Z',
			clientName: client.name,
			studioId: 'c0000000-0000-4000-8000-0000000000cc',
			studioName: 'Invented Studio',
			clinicName: 'Invented Pelvic Health',
			physioName: 'Invented Physio',
			reason: 'A gap of 2.5 finger widths at the navel, 12 weeks after the birth.',
			redFlags: [],
			createdById: null,
			createdByName: 'Invented Instructor',
			viewer: 'clinic',
			client: { name: client.name, stage: 'postpartum' },
			history: [
				{
					from: 'sent',
					to: 'accepted',
					at: '2026-11-22T09:00:00.000Z',
					byName: 'Invented Physio',
					byRole: 'physiotherapist',
					reason: null
				}
			],
			screenings: [screening],
			snapshotTakenAt: null,
			sharing: { status: 'active', endedAt: null, canSend: true, screeningsLive: true },
			actions: []
		} as unknown as ReferralDetail;
		const documents: DocumentItem[] = [
			{
				id: 'd0000000-0000-4000-8000-0000000000dd',
				name: 'Assessment.pdf',
				share: 'studio',
				size: 6144,
				pages: 1,
				uploadedAt: '2026-11-23T09:00:00.000Z',
				uploadedBy: 'Invented Physio',
				summary: 'Breathing and side-lying work for now.'
			}
		];
		const b = buildReferralBundle(detail, documents, ORIGIN, new Date('2026-12-01T12:00:00Z'));
		const result = new Fhir().validate(b);
		expect(result.messages.filter((m) => m.severity === 'error')).toEqual([]);
		const types = b.entry.map((e) => e.resource.resourceType);
		expect(types).toEqual([
			'Patient',
			'ServiceRequest',
			'Task',
			'Observation',
			'Observation',
			'Observation',
			'DocumentReference'
		]);
		const request = b.entry[1]!.resource;
		expect(request).toMatchObject({ intent: 'proposal', status: 'active', priority: 'urgent' });
		const doc = b.entry[6]!.resource as unknown as {
			content: Array<{ attachment: { size: number } }>;
		};
		expect(doc.content[0]!.attachment.size).toBe(6144);
	});
});
