// When a client's request to erase her data must be answered. GDPR Art. 12(3): "without undue
// delay and in any event within one month of receipt of the request". A month is counted from
// the day of receipt to the same day of the next month; when that month has no such day
// (31 January → February), the period ends on the month's last day. Days are UTC calendar days.

const DAY_MS = 24 * 60 * 60 * 1000;

/** The day (YYYY-MM-DD) by which a request received at `receivedAt` must be answered. */
export function erasureDueOn(receivedAt: Date): string {
	const year = receivedAt.getUTCFullYear();
	const month = receivedAt.getUTCMonth() + 1;
	const day = receivedAt.getUTCDate();
	const lastOfNext = new Date(Date.UTC(year, month + 1, 0)).getUTCDate();
	return new Date(Date.UTC(year, month, Math.min(day, lastOfNext))).toISOString().slice(0, 10);
}

/** An open request is overdue from the day after its due day. */
export function isErasureOverdue(dueOn: string, today: Date): boolean {
	return today.toISOString().slice(0, 10) > dueOn;
}

/** Whole days left until the due day (0 on the day itself, negative once overdue). */
export function daysUntilDue(dueOn: string, today: Date): number {
	const due = Date.parse(`${dueOn}T00:00:00Z`);
	const start = Date.parse(`${today.toISOString().slice(0, 10)}T00:00:00Z`);
	return Math.round((due - start) / DAY_MS);
}
