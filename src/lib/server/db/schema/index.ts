export * from './auth';
export * from './organisations';
export * from './audit';
export * from './outbox';
