export { AUDIT_ACTIONS, AUDIT_OUTCOMES, type AuditAction, type AuditOutcome } from './actions';
export {
	recordAccess,
	recordRefusal,
	subjectKeyFor,
	systemContext,
	type AccessContext,
	type AccessEvent
} from './writer';
