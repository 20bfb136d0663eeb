import { Fhir } from 'fhir';
import { describe, expect, it } from 'vitest';
import { AUDIT_ACTIONS } from '../actions';
import { auditBundle, fhirAction, FHIR_OUTCOME } from './fhir';
import type { AccessEventItem } from './service';

// Access-log events as FHIR R4 AuditEvents, on fixed invented events, validated offline by
// the `fhir` package. Codes: HL7 FHIR R4 AuditEvent — action C/R/U/D/E, outcome 0/4/8/12
// (REFERENCES.md "Open standards").

const event = (over: Partial<AccessEventItem>): AccessEventItem => ({
	id: 41,
	at: '2026-11-30T10:15:00.000Z',
	actor: {
		id: '5b0e3a4f-6c1d-4e2f-9a3b-7c8d9e0f1a2b',
		name: 'Invented Instructor',
		role: 'instructor',
		organisationId: null,
		organisationName: 'Invented Studio'
	},
	action: 'client.read',
	label: 'Opened a client record',
	target: { type: 'client', id: '6f1c3b1e-0d4a-4c53-9a53-3f0f4c1f6a01' },
	client: null,
	outcome: 'success',
	address: '192.0.2.7',
	...over
});

describe('access-log events as FHIR AuditEvents', () => {
	it('a page of events is a valid R4 Bundle, with a next link', () => {
		const bundle = auditBundle(
			[
				event({}),
				event({ id: 42, action: 'referral.created', outcome: 'refused' }),
				event({
					id: 43,
					actor: {
						id: null,
						name: null,
						role: 'system',
						organisationId: null,
						organisationName: null
					},
					target: null,
					address: null,
					action: 'clearance.reminded'
				})
			],
			'https://seamwell.example',
			'https://seamwell.example/api/v1/audit?format=fhir&cursor=abc'
		);
		const result = new Fhir().validate(bundle);
		expect(result.messages.filter((m) => m.severity === 'error')).toEqual([]);
		expect(result.valid).toBe(true);
	});

	it('maps every action code to C, R, U, D or E and every outcome to 0, 4 or 8', () => {
		for (const action of AUDIT_ACTIONS)
			expect(['C', 'R', 'U', 'D', 'E']).toContain(fhirAction(action));
		expect(fhirAction('client.read')).toBe('R');
		expect(fhirAction('screening.recorded')).toBe('C');
		expect(fhirAction('consent.withdrawn')).toBe('D');
		expect(FHIR_OUTCOME).toEqual({ success: '0', refused: '4', failed: '8' });
	});
});
