// The client's self-checks and home practice, one module per part; callers import from here.
// Every exported function begins by asserting a rule from ./policy.ts; work and its access-log
// row share one transaction. Limits come only from `effectiveLimits` and home practice is
// checked only by `checkPlan`.
export * from './self-checks';
export * from './home-practice';
export * from './follow-ups';
export * from './reminders';
