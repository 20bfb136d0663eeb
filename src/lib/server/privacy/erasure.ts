// A client's request that her studio erase her data, and the studio admin's answer
// (GDPR Art. 17; answered within a month, Art. 12(3)). The client asks from her Privacy page
// (erasure-client.ts); an admin of her studio approves (erase.ts does the erasing, in the same
// transaction) or declines with a reason she reads (erasure-admin.ts). One open request per
// client at a time.
export type { ErasurePreview, ErasureRequestItem, ErasureState } from './erasure-items';
export * from './erasure-client';
export * from './erasure-admin';
