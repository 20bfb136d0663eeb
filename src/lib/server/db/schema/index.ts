export * from './auth';
export * from './organisations';
export * from './audit';
export * from './outbox';
export * from './clients';
export * from './sharing';
export * from './documents';
export * from './clearance';
