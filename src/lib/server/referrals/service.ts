// Referrals from a studio's instructor to a clinic, one module per part; callers import from
// here. Every exported function asserts its rule from ./policy.ts first; work and its
// access-log row share one transaction; a refusal is logged in a transaction of its own (it
// survives the work's rollback) and then thrown. Consent is read fresh, inside the
// transaction of the move it allows.
export * from './open';
export * from './lists';
export * from './detail';
export * from './transitions';
