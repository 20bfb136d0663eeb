/**
 * The words of every notification Seamwell sends: a subject and a first line per kind, so a
 * reader can triage her inbox. They say what happened and where to look — never a client's
 * name, a measurement, a finding, a clearance or a condition: those stay behind the sign-in.
 */
export const NOTIFICATION_WORDS = {
	'referral.received': {
		subject: 'A referral for your clinic',
		line: 'A studio has sent your clinic a referral. Sign in to read it and answer.'
	},
	'referral.accepted': {
		subject: 'Your referral was accepted',
		line: 'A clinic has accepted a referral you sent. Sign in to see who will see her.'
	},
	'referral.declined': {
		subject: 'Your referral was declined',
		line: 'A clinic has declined a referral you sent. Sign in to read its reason.'
	},
	'referral.assessed': {
		subject: 'An assessment is ready for one of your referrals',
		line: 'A physiotherapist has assessed a client you referred. Sign in to see what she shared.'
	},
	'referral.closed': {
		subject: 'A referral was closed',
		line: 'A clinic has closed a referral you sent. Sign in to see it.'
	},
	'referral.withdrawn': {
		subject: 'A referral to your clinic was withdrawn',
		line: 'The studio has withdrawn a referral it sent your clinic. Sign in to see it.'
	},
	'referral.sharing_ended': {
		subject: 'Sharing ended for one of your referrals',
		line: 'A client has withdrawn her consent to share, so her open referral has ended. What was already shared stays on record.'
	},
	'document.shared': {
		subject: 'A clinic shared a document with your studio',
		line: 'A physiotherapist has shared a document on one of your referrals. Sign in to read it.'
	},
	'consent.requested': {
		subject: 'Your studio asks before sharing your record',
		line: 'Your studio would like to share your record with a clinic, and asks for your consent first.'
	},
	'clearance.set': {
		subject: 'A physiotherapist set a clearance for one of your clients',
		line: 'A physiotherapist has set what one of your clients may do in class. Sign in to read it before you plan her sessions.'
	},
	'clearance.review_due': {
		subject: 'A clearance is due for review in a week',
		line: 'A movement clearance you follow reaches its review date in a week. Sign in to see it.'
	},
	'clearance.review_requested': {
		subject: 'A studio asks you to review a clearance',
		line: 'An instructor asks you to look again at a clearance you set. Sign in to see her question.'
	},
	'consent.given': {
		subject: 'A client gave consent to share — you can now send the referral',
		line: 'A client has given her consent to share with a clinic. Sign in to send her referral.'
	},
	'erasure.requested': {
		subject: 'A client asks your studio to erase her data',
		line: 'A client has asked your studio to erase her data. The law gives you one month to answer; sign in to see what it covers and approve or decline.'
	},
	'erasure.approved': {
		subject: 'Your studio has erased your data',
		line: 'Your studio has erased your record, your screenings and your sign-in from Seamwell, as you asked. A clinic you were referred to keeps its own records, as the law requires of it.'
	},
	'erasure.declined': {
		subject: 'Your studio answered your request to erase your data',
		line: 'Your studio has declined your request to erase your data and written down why. Sign in to read its reason.'
	},
	'erasure.clinic_informed': {
		subject: 'A studio erased its copy of a client you were referred',
		line: "A studio has erased a client's record at her request. Your clinic's own records of the referral are unchanged; the studio no longer sees them, and nothing more is shared."
	},
	'practice.reminder': {
		subject: 'A reminder from Seamwell: your home practice',
		line: 'This is the reminder you asked for: a moment for your home practice and, if you like, a check of how you feel.'
	}
} as const satisfies Record<string, { subject: string; line: string }>;

export type NotificationKind = keyof typeof NOTIFICATION_WORDS;
