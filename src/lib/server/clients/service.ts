// Client records and their screenings, one module per part; callers import from here. Every
// exported function begins by asserting a rule from ./policy.ts, does its work and its
// access-log row in one transaction, and answers 404 (logged) for a record the caller may not
// know of.
export type {
	ClientDetail,
	ClientSummary,
	FingerFactor,
	RecordedScreening,
	ScreeningHistory,
	ScreeningView,
	TrendBySite,
	TrendView
} from '$lib/clients/types';
export * from './records';
export * from './screenings';
export * from './access';
