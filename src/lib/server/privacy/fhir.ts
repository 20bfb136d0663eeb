// The client's data as a FHIR R4 Bundle (type `collection`), built by pure functions from the
// same export document as the JSON download. Terms with no standard code use Seamwell's own
// code system, whose canonical URL is a page of the app describing it (/fhir/CodeSystem/…).
// Checked in fhir.test.ts with the `fhir` package (HL7 R4 StructureDefinitions, offline) plus
// our own assertions for what it does not check (Consent ppc-1; references resolve).
import { SITES, type Site } from '$lib/domain/sites';
import type { ReferralState } from '$lib/domain/referral';
import type { ConsentStatus } from '$lib/domain/consent';
import type { ClientDetail, ScreeningView } from '$lib/clients/types';
import type { ConsentGrantView } from '../consents/service';
import type { ClientReferral } from '../referrals/for-client';
import type { SelfCheckView } from '../self-care/service';
import type { DocumentItem } from '../documents/service';
import type { ReferralDetail } from '$lib/referrals/types';

export type FhirResource = { resourceType: string; id: string } & Record<string, unknown>;
export interface FhirBundle {
	resourceType: 'Bundle';
	type: 'collection';
	timestamp: string;
	entry: Array<{ fullUrl: string; resource: FhirResource }>;
}

/** Seamwell's own code system (sites, measures, scopes), described at this URL. */
export const codeSystemUrl = (origin: string) => `${origin}/fhir/CodeSystem/seamwell`;
const UCUM = 'http://unitsofmeasure.org';

/**
 * Referral state → ServiceRequest.status (HL7 FHIR R4 request-status; REFERENCES.md). An
 * instructor proposes care, she does not order it: intent is always `proposal`.
 */
export const SERVICE_REQUEST_STATUS: Record<ReferralState, string> = {
	draft: 'draft',
	sent: 'active',
	accepted: 'active',
	assessed: 'active',
	declined: 'revoked',
	closed: 'completed',
	withdrawn: 'revoked'
};

/** The clinic's answer as a Task (R4 task-status); states with no answer yet have no Task. */
export const TASK_STATUS: Partial<Record<ReferralState, string>> = {
	sent: 'requested',
	accepted: 'accepted',
	assessed: 'in-progress',
	declined: 'rejected',
	closed: 'completed',
	withdrawn: 'cancelled'
};

/** Our consent status → Consent.status (R4 consent-state-codes: "withdrawn" is not one). */
export const CONSENT_STATUS: Record<ConsentStatus, string> = {
	active: 'active',
	not_started: 'proposed',
	ended: 'inactive',
	withdrawn: 'inactive'
};

const SITE_INDEX: Record<Site, number> = { above_navel: 1, at_navel: 2, below_navel: 3 };

export interface FhirExportInput {
	client: ClientDetail;
	screenings: ScreeningView[];
	consents: ConsentGrantView[];
	referrals: ClientReferral[];
	selfChecks?: SelfCheckView[];
	/** Documents the clinic shared with her studio: DocumentReferences to their download. */
	documents?: DocumentItem[];
}

export function patientOf(client: ClientDetail): FhirResource {
	return {
		resourceType: 'Patient',
		id: client.id,
		name: [{ text: client.name }],
		...(client.email ? { telecom: [{ system: 'email', value: client.email }] } : {})
	};
}

/** One site's finger-width Observation: what a screening and her own check have in common. */
function widthObservation(
	origin: string,
	patientId: string,
	o: {
		id: string;
		takenAt: string;
		site: Site;
		widthFingers: number;
		text: string;
		component: Array<Record<string, unknown>>;
	}
): FhirResource {
	const system = codeSystemUrl(origin);
	return {
		resourceType: 'Observation',
		id: o.id,
		status: 'final',
		category: [
			{
				coding: [
					{ system: 'http://terminology.hl7.org/CodeSystem/observation-category', code: 'exam' }
				]
			}
		],
		code: {
			coding: [{ system, code: 'gap-width-fingers', display: 'Midline gap, finger-width test' }],
			text: o.text
		},
		subject: { reference: `Patient/${patientId}` },
		effectiveDateTime: o.takenAt,
		bodySite: { coding: [{ system, code: o.site }], text: o.site.replaceAll('_', ' ') },
		valueQuantity: {
			value: o.widthFingers,
			unit: 'finger widths',
			system: UCUM,
			code: '{finger-width}'
		},
		component: o.component
	};
}

export function siteObservations(
	screening: ScreeningView,
	patientId: string,
	origin: string
): FhirResource[] {
	const system = codeSystemUrl(origin);
	return SITES.map((site) => {
		const m = screening.sites[site];
		const component: Array<Record<string, unknown>> = [
			{
				code: { coding: [{ system, code: 'gap-depth', display: 'Depth of the gap' }] },
				valueCodeableConcept: { coding: [{ system, code: `depth-${m.depth}` }], text: m.depth }
			},
			{
				code: { coding: [{ system, code: 'midline-tension', display: 'Midline tension' }] },
				valueCodeableConcept: {
					coding: [{ system, code: `tension-${m.tension}` }],
					text: m.tension
				}
			},
			{
				code: { coding: [{ system, code: 'doming', display: 'Doming on effort' }] },
				valueBoolean: m.doming
			}
		];
		if (m.widthMm != null) {
			component.unshift({
				code: { coding: [{ system, code: 'gap-width-mm', display: 'Gap width, measured' }] },
				valueQuantity: { value: m.widthMm, unit: 'mm', system: UCUM, code: 'mm' }
			});
		}
		return widthObservation(origin, patientId, {
			id: `${screening.id}-${SITE_INDEX[site]}`,
			takenAt: screening.takenAt,
			site,
			widthFingers: m.widthFingers,
			text: 'Midline gap width (finger widths, screening by a movement instructor)',
			component
		});
	});
}

/**
 * Her own finger-width checks: one Observation per site, the performer herself, and a
 * `self-reported` meta tag, never mixed with an instructor's screening.
 */
export function selfCheckObservations(
	check: SelfCheckView,
	patientId: string,
	origin: string
): FhirResource[] {
	if (!check.sites) return [];
	const system = codeSystemUrl(origin);
	return SITES.map((site) => {
		const m = check.sites![site];
		return {
			...widthObservation(origin, patientId, {
				id: `${check.id}-${SITE_INDEX[site]}`,
				takenAt: check.takenAt,
				site,
				widthFingers: m.widthFingers,
				text: 'Midline gap width (finger widths, her own check)',
				component: [
					{
						code: { coding: [{ system, code: 'gap-deep', display: 'The gap felt deep' }] },
						valueBoolean: m.deep
					},
					{
						code: { coding: [{ system, code: 'doming', display: 'Doming on effort' }] },
						valueBoolean: m.doming
					}
				]
			}),
			meta: { tag: [{ system, code: 'self-reported', display: 'Reported by the client herself' }] },
			performer: [{ reference: `Patient/${patientId}` }]
		};
	});
}

export function referralResources(referral: ClientReferral, patientId: string): FhirResource[] {
	const request: FhirResource = {
		resourceType: 'ServiceRequest',
		id: referral.id,
		status: SERVICE_REQUEST_STATUS[referral.state],
		intent: 'proposal',
		code: { text: 'Pelvic-health physiotherapy assessment' },
		subject: { reference: `Patient/${patientId}` },
		authoredOn: referral.sentAt ?? referral.createdAt,
		performer: [{ display: referral.clinicName }]
	};
	const taskStatus = TASK_STATUS[referral.state];
	if (!taskStatus) return [request];
	const task: FhirResource = {
		resourceType: 'Task',
		id: `${referral.id}-answer`,
		status: taskStatus,
		intent: 'order',
		focus: { reference: `ServiceRequest/${referral.id}` },
		for: { reference: `Patient/${patientId}` },
		lastModified: referral.changedAt,
		owner: { display: referral.clinicName },
		...(referral.clinicNote ? { note: [{ text: referral.clinicNote }] } : {})
	};
	return [request, task];
}

export function consentOf(
	grant: ConsentGrantView,
	patientId: string,
	origin: string
): FhirResource {
	const end = grant.withdrawnAt ?? grant.endsAt;
	return {
		resourceType: 'Consent',
		id: grant.id,
		status: CONSENT_STATUS[grant.status],
		scope: {
			coding: [
				{ system: 'http://terminology.hl7.org/CodeSystem/consentscope', code: 'patient-privacy' }
			]
		},
		category: [{ coding: [{ system: 'http://loinc.org', code: '59284-0' }] }],
		patient: { reference: `Patient/${patientId}` },
		dateTime: grant.startsAt,
		organization: [{ display: grant.clinicName }],
		// ppc-1: a policy or a policyRule. Opt-in: nothing is shared unless she says so.
		policyRule: {
			coding: [{ system: 'http://terminology.hl7.org/CodeSystem/v3-ActCode', code: 'OPTIN' }]
		},
		provision: {
			type: 'permit',
			period: { start: grant.startsAt, ...(end ? { end } : {}) },
			class: grant.scopes.map((scope) => ({
				system: codeSystemUrl(origin),
				code: `share-${scope}`
			}))
		}
	};
}

/** Resources as a Bundle of type collection, each under its own full URL. */
function collection(resources: FhirResource[], origin: string, now: Date): FhirBundle {
	return {
		resourceType: 'Bundle',
		type: 'collection',
		timestamp: now.toISOString(),
		entry: resources.map((resource) => ({
			fullUrl: `${origin}/fhir/${resource.resourceType}/${resource.id}`,
			resource
		}))
	};
}

/** Every resource of hers, each once, in one collection. */
export function buildClientBundle(
	input: FhirExportInput,
	origin: string,
	now = new Date()
): FhirBundle {
	const patientId = input.client.id;
	const resources: FhirResource[] = [
		patientOf(input.client),
		...input.screenings.flatMap((s) => siteObservations(s, patientId, origin)),
		...(input.selfChecks ?? []).flatMap((c) => selfCheckObservations(c, patientId, origin)),
		...input.referrals.flatMap((r) => referralResources(r, patientId)),
		...input.consents.map((c) => consentOf(c, patientId, origin)),
		...(input.documents ?? []).map((d) => documentReferenceOf(d, patientId, origin))
	];
	return collection(resources, origin, now);
}

/** A document the reader may download, as a DocumentReference pointing at the download. */
export function documentReferenceOf(
	doc: DocumentItem,
	patientId: string,
	origin: string
): FhirResource {
	return {
		resourceType: 'DocumentReference',
		id: doc.id,
		status: 'current',
		type: { text: 'Pelvic-health physiotherapy assessment' },
		subject: { reference: `Patient/${patientId}` },
		date: doc.uploadedAt,
		...(doc.summary ? { description: doc.summary } : {}),
		content: [
			{
				attachment: {
					contentType: 'application/pdf',
					url: `${origin}/api/v1/documents/${doc.id}`,
					size: doc.size,
					title: doc.name,
					creation: doc.uploadedAt
				}
			}
		]
	};
}

/**
 * One referral for the clinic's own record system: the Patient as the referral carries her,
 * the ServiceRequest and the clinic's Task, the screening history sent with it and the
 * documents the reader may download — what the referral page shows, nothing more.
 */
export function buildReferralBundle(
	referral: ReferralDetail,
	documents: DocumentItem[],
	origin: string,
	now = new Date()
): FhirBundle {
	// A referral whose studio erased her record keeps the clinic's copy of who she was; the
	// Patient then takes a local id of its own (the studio's record id is gone).
	const patientId = referral.clientId ?? `erased-${referral.id}`;
	const last = referral.history.at(-1);
	const [request, ...rest] = referralResources(
		{
			id: referral.id,
			state: referral.state,
			clinicName: referral.clinicName,
			physioName: referral.physioName,
			createdAt: referral.createdAt,
			sentAt: referral.sentAt,
			changedAt: last?.at ?? referral.createdAt,
			clinicNote: last && last.byRole !== 'instructor' ? last.reason : null
		},
		patientId
	);
	const resources: FhirResource[] = [
		{ resourceType: 'Patient', id: patientId, name: [{ text: referral.client.name }] },
		{
			...request!,
			reasonCode: [{ text: referral.reason }],
			requester: {
				display: `${referral.createdByName ?? 'An instructor'}, ${referral.studioName}`
			},
			priority: referral.urgency === 'soon' ? 'urgent' : 'routine'
		},
		...rest,
		...referral.screenings.flatMap((s) => siteObservations(s as ScreeningView, patientId, origin)),
		...documents.map((d) => documentReferenceOf(d, patientId, origin))
	];
	return collection(resources, origin, now);
}
