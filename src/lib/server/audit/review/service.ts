// The admin's review of the access log. Every exported function asserts `reviewerOf` (an
// admin of the organisation she acts in) and reads only events in that organisation's
// scope (./scope.ts). Reads are logged as `audit.read`, exports as `audit.exported`.
// Its parts: events.ts (shared), reads.ts, export.ts, verify-log.ts and activity.ts.

export { eventsQuery, type AccessEventItem } from './events';
export { getAccessEvent, listAccessEvents } from './reads';
export * from './export';
export * from './verify-log';
export * from './activity';
