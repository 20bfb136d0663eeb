// Consent to share between a client's studio and one clinic, one module per part; callers
// import from here. The client gives and withdraws her own grants; her studio's instructors may
// ask her to; admins read their organisation's. Every exported function asserts its rule
// first; work and its access-log row share one transaction; a refusal is logged in its own
// transaction and then thrown.
export type { ConsentItem } from './shared';
export * from './reading';
export * from './changes';
