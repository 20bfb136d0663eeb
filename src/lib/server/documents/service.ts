// Assessment documents and the referral letter's download, one module per part; callers import
// from here. Every exported function asserts its rule from ./policy.ts first; consent is read
// fresh on every request. Storage and database cannot share a transaction, so an upload writes
// the object first and its row second (see ./upload.ts and ./sweeper.ts).
export { documentKey, type DocumentItem, type DownloadedFile } from './shared';
export * from './upload';
export * from './listing';
export * from './downloads';
