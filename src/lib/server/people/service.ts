// Organisations, memberships and invitations, one module per part; callers import from here.
// Every exported function begins by asserting its policy rule (./policy.ts) and names it, with
// its access-log action, in one line.
export { INVITATION_DAYS } from './shared';
export * from './me';
export * from './members';
export * from './invitation-links';
