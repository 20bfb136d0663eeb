// The referral letter: store.ts makes it once, when a referral is sent, and keeps it; the
// drawing is split by what it draws — page.ts (A4 geometry, type, colours and the writer that
// flows text across pages), parties.ts (header, who and why), chart.ts (the three sites over
// time), table.ts (every screening) and render.ts (the rest, and the whole letter in order).
export * from './store';
export { renderReferralLetter } from './render';
export { formatLetterDate } from './page';
export type { LetterScreening, ReferralLetterInput } from './page';
