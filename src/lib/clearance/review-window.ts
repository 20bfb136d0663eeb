// When a clearance's review may fall, without zod: the clearance form's date picker needs it
// in the browser (./schemas.ts re-exports it for the server).

export const REVIEW_MAX_WEEKS = 26;
const MS_PER_DAY = 86_400_000;

/** Today and the last allowed review day, as YYYY-MM-DD (UTC). */
export function reviewWindow(now = new Date()): { first: string; last: string } {
	const today = Date.parse(`${now.toISOString().slice(0, 10)}T00:00:00Z`);
	const day = (ms: number) => new Date(ms).toISOString().slice(0, 10);
	return { first: day(today + MS_PER_DAY), last: day(today + REVIEW_MAX_WEEKS * 7 * MS_PER_DAY) };
}
