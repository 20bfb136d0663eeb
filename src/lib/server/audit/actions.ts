// The published list of access-log action codes. A code names what was attempted; the
// row's outcome says how it ended. Add codes here (and only here) as features arrive.
export const AUDIT_ACTIONS = [
	'signin.requested',
	'signin.succeeded',
	'signin.refused',
	'signin.failed',
	'signout',
	'session.expired',
	'invitation.sent',
	'invitation.accepted',
	'invitation.revoked',
	'member.role_changed',
	'member.deactivated',
	'client.created',
	'client.read',
	'client.listed',
	'client.updated',
	'screening.recorded',
	'screening.read',
	'consent.given',
	'consent.withdrawn',
	'consent.requested',
	'consent.read',
	'referral.created',
	'referral.read',
	'referral.listed',
	'referral.transitioned',
	'document.uploaded',
	'document.downloaded',
	'document.updated',
	'letter.downloaded',
	'clearance.set',
	'clearance.read',
	'audit.read',
	'audit.exported',
	'audit.verified',
	'access.denied'
] as const;

export type AuditAction = (typeof AUDIT_ACTIONS)[number];

export const AUDIT_OUTCOMES = ['success', 'refused', 'failed'] as const;
export type AuditOutcome = (typeof AUDIT_OUTCOMES)[number];
