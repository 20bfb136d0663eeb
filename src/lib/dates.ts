// Every date and time Seamwell shows, in one place.
//
// The locale is deliberate, not the browser's: pages render on the server first, where the
// reader's locale is unknown, so a browser-dependent format would change under her eyes on
// hydration. Seamwell writes British English, so it shows dates as en-GB with the month in
// words ("3 Dec 2026") — unambiguous to readers used to either day/month order. Calendar days
// (birth dates, screening days) are stored as UTC days and shown in UTC, so a day never moves
// to the day before; moments (when a referral was sent, a document uploaded) are shown in UTC
// and say so, the same for the studio and the clinic. A per-organisation time zone would be
// the next step, and would change only this module.

export const LOCALE = 'en-GB';

const dayShort = new Intl.DateTimeFormat(LOCALE, {
	day: 'numeric',
	month: 'short',
	year: 'numeric',
	timeZone: 'UTC'
});
const dayLong = new Intl.DateTimeFormat(LOCALE, {
	day: 'numeric',
	month: 'long',
	year: 'numeric',
	timeZone: 'UTC'
});
const dayMonth = new Intl.DateTimeFormat(LOCALE, {
	day: 'numeric',
	month: 'short',
	timeZone: 'UTC'
});
const momentFormat = new Intl.DateTimeFormat(LOCALE, {
	day: 'numeric',
	month: 'short',
	year: 'numeric',
	hour: '2-digit',
	minute: '2-digit',
	timeZone: 'UTC'
});
const momentSeconds = new Intl.DateTimeFormat(LOCALE, {
	day: 'numeric',
	month: 'short',
	year: 'numeric',
	hour: '2-digit',
	minute: '2-digit',
	second: '2-digit',
	timeZone: 'UTC'
});
const weekdayShort = new Intl.DateTimeFormat(LOCALE, {
	weekday: 'short',
	day: 'numeric',
	month: 'short',
	timeZone: 'UTC'
});
const weekdayLong = new Intl.DateTimeFormat(LOCALE, {
	weekday: 'long',
	day: 'numeric',
	month: 'long',
	timeZone: 'UTC'
});
const clockSeconds = new Intl.DateTimeFormat(LOCALE, {
	hour: '2-digit',
	minute: '2-digit',
	second: '2-digit',
	timeZone: 'UTC'
});
const clock = new Intl.DateTimeFormat(LOCALE, {
	hour: '2-digit',
	minute: '2-digit',
	timeZone: 'UTC'
});

const toDate = (value: string | Date) => (value instanceof Date ? value : new Date(value));

/** "3 Dec 2026": tables, lists and sentences. */
export const formatDate = (value: string | Date) => dayShort.format(toDate(value));

/** "3 December 2026": where the date stands alone and there is room. */
export const formatDateLong = (value: string | Date) => dayLong.format(toDate(value));

/** "3 Dec": chart axis ticks. */
export const formatDayMonth = (value: string | Date) => dayMonth.format(toDate(value));

/** "3 Dec 2026, 14:05 UTC": when something happened. */
export const formatMoment = (value: string | Date) => `${momentFormat.format(toDate(value))} UTC`;

/** "3 Dec 2026, 14:05:09 UTC": the access log, where seconds tell events apart. */
export const formatMomentSeconds = (value: string | Date) =>
	`${momentSeconds.format(toDate(value))} UTC`;

/** "Thu 3 Dec, 18:30 UTC" (`long`: "Thursday 3 December, 18:30 UTC"): when a class meets. */
export const formatSession = (value: string | Date, long = false) =>
	`${(long ? weekdayLong : weekdayShort).format(toDate(value))}, ${formatClock(value)}`;

/** "14:05:09 UTC": when a check ran, to the second. */
export const formatClockSeconds = (value: string | Date) =>
	`${clockSeconds.format(toDate(value))} UTC`;

/** "14:05 UTC": the time of day, for "updated at". */
export const formatClock = (value: string | Date) => `${clock.format(toDate(value))} UTC`;

/** An optional day, or a dash. */
export const formatDateOrDash = (value: string | Date | null | undefined, long = false) =>
	value ? (long ? formatDateLong(value) : formatDate(value)) : '—';

/** Numbers in the same locale ("1.5"). */
export const formatNumber = (value: number) => value.toLocaleString(LOCALE);
