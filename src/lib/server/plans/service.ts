// The exercise library and session plans, one module per part; callers import from here.
// Every exported function begins by asserting a rule from ./policy.ts, does its work and its
// access-log rows in one transaction, and answers 404 (logged) for a plan, exercise or client
// the caller may not know of. Levels come only from the clearance module's
// loadEffectiveLimits: nothing here derives a level.
export { assertMayPlan } from './shared';
export * from './library';
export * from './edit';
export * from './check';
export * from './review-requests';
export * from './for-client';
