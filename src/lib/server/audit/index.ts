export { AUDIT_ACTIONS, AUDIT_OUTCOMES, type AuditAction, type AuditOutcome } from './actions';
export {
	recordAccess,
	recordAccesses,
	recordSuccesses,
	recordRefusal,
	hasRecordedRefusal,
	subjectKeyFor,
	forgetSubjectKey,
	systemContext,
	type AccessContext,
	type AccessEvent
} from './writer';
export { sealPending, startSealer, type SealResult } from './sealer';
export {
	describeReport,
	verifyAnchored,
	verifyChain,
	type BrokenLink,
	type VerifyReport
} from './verify';
export { anchorHead, memoryAnchorStore, type AnchorStore } from './anchors';
