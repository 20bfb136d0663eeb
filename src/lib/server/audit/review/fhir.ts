// The admin's access-log review as FHIR R4 AuditEvents (a Bundle of type `collection`, one
// page of the same filtered, scoped list as the JSON answer; the next page is a `next` link).
// Element rules: HL7 FHIR R4 AuditEvent (REFERENCES.md "Open standards"): type, recorded,
// agent with requestor, source with observer; action C/R/U/D/E; outcome 0/4/8/12.
import type { AccessEventItem } from './service';

/** What kind of operation an action code is (R4 audit-event-action). */
export function fhirAction(action: string): 'C' | 'R' | 'U' | 'D' | 'E' {
	if (/\.(read|listed|downloaded|exported|access_read)$/.test(action)) return 'R';
	if (/\.(created|recorded|given|sent|uploaded|requested|set)$/.test(action)) return 'C';
	if (/\.(updated|transitioned|role_changed|overridden|ready|declined|followed_up)$/.test(action))
		return 'U';
	if (/\.(withdrawn|deactivated|revoked|erased)$/.test(action)) return 'D';
	return 'E';
}

/** success → 0 (success), refused → 4 (minor failure), failed → 8 (serious failure). */
export const FHIR_OUTCOME: Record<string, '0' | '4' | '8' | '12'> = {
	success: '0',
	refused: '4',
	failed: '8'
};

export function auditEventOf(item: AccessEventItem, origin: string): Record<string, unknown> {
	const who = item.actor.id
		? {
				identifier: { system: `${origin}/fhir/users`, value: item.actor.id },
				display: item.actor.name ?? 'Unnamed person'
			}
		: { display: item.actor.role === 'system' ? 'Seamwell itself' : 'Not signed in' };
	return {
		resourceType: 'AuditEvent',
		id: String(item.id),
		type: {
			system: 'http://terminology.hl7.org/CodeSystem/audit-event-type',
			code: 'rest',
			display: 'RESTful Operation'
		},
		subtype: [
			{ system: `${origin}/fhir/CodeSystem/seamwell-audit`, code: item.action, display: item.label }
		],
		action: fhirAction(item.action),
		recorded: item.at,
		outcome: FHIR_OUTCOME[item.outcome] ?? '8',
		agent: [
			{
				who,
				requestor: true,
				...(item.actor.role ? { role: [{ text: item.actor.role }] } : {}),
				...(item.address ? { network: { address: item.address, type: '2' } } : {})
			}
		],
		source: { observer: { display: 'Seamwell' } },
		...(item.target
			? {
					entity: [
						{
							what: {
								identifier: {
									system: `${origin}/fhir/CodeSystem/seamwell-audit`,
									value: `${item.target.type}:${item.target.id}`
								}
							}
						}
					]
				}
			: {})
	};
}

export function auditBundle(
	items: AccessEventItem[],
	origin: string,
	next: string | null,
	now = new Date()
): Record<string, unknown> {
	return {
		resourceType: 'Bundle',
		type: 'collection',
		timestamp: now.toISOString(),
		...(next ? { link: [{ relation: 'next', url: next }] } : {}),
		entry: items.map((item) => ({
			fullUrl: `${origin}/fhir/AuditEvent/${item.id}`,
			resource: auditEventOf(item, origin)
		}))
	};
}
