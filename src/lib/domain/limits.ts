// What a client may do in class now: `effectiveLimits` combines a clinician's clearance, the
// holds from her screenings, her record and her own reports, the more cautious rule winning.
// The rules and their thresholds are in limits-rules.ts, the holds in limits-holds.ts, and
// their combination in limits-apply.ts.
export {
	CAESAREAN_HOLD_WEEKS,
	IMPACT_HOLD_WEEKS,
	NO_LIMIT_REASON,
	POSTNATAL_CHECK_WEEKS,
	WIDENING_FINGER_WIDTHS
} from './limits-rules';
export { effectiveLimits } from './limits-apply';
