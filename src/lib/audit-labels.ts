// Plain words for the access log's action codes, for the admin's review (browser-safe: the
// import below is a type only). Typed over every code, so a new action cannot go unlabelled.
import type { AuditAction } from '$lib/server/audit/actions';

export const AUDIT_ACTION_LABELS: Record<AuditAction, string> = {
	'signin.requested': 'Asked for a sign-in link',
	'signin.succeeded': 'Signed in',
	'signin.refused': 'Sign-in refused',
	'signin.failed': 'Sign-in failed',
	signout: 'Signed out',
	'session.expired': 'Session ended',
	'invitation.sent': 'Sent an invitation',
	'invitation.accepted': 'Accepted an invitation',
	'invitation.revoked': 'Withdrew an invitation',
	'member.role_changed': 'Changed a member’s role',
	'member.deactivated': 'Deactivated a member',
	'client.created': 'Added a client record',
	'client.read': 'Opened a client record',
	'client.listed': 'Listed clients',
	'client.updated': 'Changed a client record',
	'client.access_read': 'Read who accessed her record',
	'client.exported': 'Downloaded her data',
	'screening.recorded': 'Recorded a screening',
	'screening.read': 'Read screenings',
	'consent.given': 'Consent given',
	'consent.withdrawn': 'Consent withdrawn',
	'consent.requested': 'Asked for consent',
	'consent.read': 'Read consents',
	'referral.created': 'Opened a referral',
	'referral.read': 'Read a referral',
	'referral.listed': 'Listed referrals',
	'referral.transitioned': 'Moved a referral on',
	'exercise.created': 'Added a studio exercise',
	'plan.created': 'Started a session plan',
	'plan.read': 'Opened a session plan',
	'plan.listed': 'Listed session plans',
	'plan.updated': 'Changed a session plan',
	'plan.ready': 'Marked a session plan ready',
	'plan.overridden': 'Kept an exercise against the check',
	'plan.printed': 'Printed a session sheet',
	'clearance.review_requested': 'Asked the clinic for a clearance review',
	'document.uploaded': 'Uploaded a document',
	'document.downloaded': 'Downloaded a document',
	'document.updated': 'Changed a document',
	'letter.downloaded': 'Downloaded a referral letter',
	'assessment.recorded': 'Recorded an assessment',
	'assessment.read': 'Read an assessment',
	'clearance.set': 'Set a clearance',
	'clearance.read': 'Read a clearance',
	'clearance.listed': 'Listed clearances',
	'clearance.reminded': 'Sent a clearance review reminder',
	'audit.read': 'Read the access log',
	'audit.exported': 'Exported the access log',
	'mail.resent': 'Sent a failed mail again',
	'audit.verified': 'Verified the access log',
	'access.denied': 'Was refused access'
};

export const actionLabel = (code: string) => AUDIT_ACTION_LABELS[code as AuditAction] ?? code;

export const OUTCOME_LABELS: Record<string, string> = {
	success: 'Done',
	refused: 'Refused',
	failed: 'Failed'
};
