// Plain words for the access log's action codes, for the admin's review (browser-safe).
export const AUDIT_ACTION_LABELS: Record<string, string> = {
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
	'document.uploaded': 'Uploaded a document',
	'document.downloaded': 'Downloaded a document',
	'document.updated': 'Changed a document',
	'letter.downloaded': 'Downloaded a referral letter',
	'clearance.set': 'Set a clearance',
	'clearance.read': 'Read a clearance',
	'audit.read': 'Read the access log',
	'audit.exported': 'Exported the access log',
	'audit.verified': 'Verified the access log',
	'self_check.recorded': 'Recorded a self-check',
	'self_check.read': 'Read self-checks',
	'self_check.sharing_changed': 'Changed self-check sharing',
	'home_practice.set': 'Set a home practice',
	'home_practice.read': 'Read a home practice',
	'home_practice.session_recorded': 'Marked a home practice done',
	'home_practice.reminder_changed': 'Changed practice reminders',
	'home_practice.reminded': 'Sent a practice reminder',
	'access.denied': 'Was refused access'
};

export const actionLabel = (code: string) => AUDIT_ACTION_LABELS[code] ?? code;

export const OUTCOME_LABELS: Record<string, string> = {
	success: 'Done',
	refused: 'Refused',
	failed: 'Failed'
};
