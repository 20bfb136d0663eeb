// The weekly activity summary: per member and week, how many reads, downloads, exports,
// changes and refusals, and whether this week's reads look unusual — more than three times
// her median of the four weeks before (common practice for a simple outlier rule, no
// source). Pure: it takes daily counts (one grouped query makes them) and the weeks wanted.

export type ActivityKind = 'read' | 'download' | 'export' | 'change' | 'refusal';
export const ACTIVITY_KINDS: ActivityKind[] = ['read', 'download', 'export', 'change', 'refusal'];

export interface DailyCount {
	userId: string;
	name: string | null;
	/** YYYY-MM-DD (UTC). */
	day: string;
	action: string;
	outcome: string;
	count: number;
}

export interface MemberWeek {
	/** The Monday the week starts on (YYYY-MM-DD, UTC). */
	week: string;
	counts: Record<ActivityKind, number>;
	/** Median reads of the four weeks before. */
	baselineReads: number;
	unusual: boolean;
}

export interface MemberActivity {
	userId: string;
	name: string | null;
	weeks: MemberWeek[];
}

/** What kind of activity an action with an outcome is. */
export function kindOf(action: string, outcome: string): ActivityKind {
	if (outcome !== 'success') return 'refusal';
	if (action === 'audit.exported') return 'export';
	if (action.endsWith('.downloaded')) return 'download';
	if (action.endsWith('.read') || action.endsWith('.listed')) return 'read';
	return 'change';
}

const DAY_MS = 86_400_000;

/**
 * A week with fewer reads than this is never flagged: three times a median of 0 or 1 would
 * flag a new member's first handful of reads (common practice, no source).
 */
export const MIN_UNUSUAL_READS = 10;

/** The Monday (UTC) of the week holding `day`. */
export function weekOf(day: string): string {
	const t = Date.parse(`${day}T00:00:00Z`);
	const weekday = (new Date(t).getUTCDay() + 6) % 7; // Monday 0 … Sunday 6
	return new Date(t - weekday * DAY_MS).toISOString().slice(0, 10);
}

export function median(values: number[]): number {
	if (values.length === 0) return 0;
	const sorted = [...values].sort((a, b) => a - b);
	const mid = Math.floor(sorted.length / 2);
	return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

/** The first day the summary needs: four weeks before the first week shown. */
export function summaryStart(today: string, weeks: number): string {
	return new Date(Date.parse(`${weekOf(today)}T00:00:00Z`) - (weeks - 1 + 4) * 7 * DAY_MS)
		.toISOString()
		.slice(0, 10);
}

const zero = (): Record<ActivityKind, number> => ({
	read: 0,
	download: 0,
	export: 0,
	change: 0,
	refusal: 0
});

/**
 * Per member (most reads this week first), the last `weeks` weeks up to the one holding
 * `today`, newest first. A week with no activity counts zero, also in the baseline.
 */
export function summariseWeeks(
	daily: DailyCount[],
	today: string,
	weeks: number
): MemberActivity[] {
	const thisWeek = Date.parse(`${weekOf(today)}T00:00:00Z`);
	const weekStarts = Array.from({ length: weeks + 4 }, (_, i) =>
		new Date(thisWeek - i * 7 * DAY_MS).toISOString().slice(0, 10)
	);
	const members = new Map<
		string,
		{ name: string | null; byWeek: Map<string, Record<ActivityKind, number>> }
	>();
	for (const d of daily) {
		const member = members.get(d.userId) ?? { name: d.name, byWeek: new Map() };
		members.set(d.userId, member);
		const week = weekOf(d.day);
		const counts = member.byWeek.get(week) ?? zero();
		member.byWeek.set(week, counts);
		counts[kindOf(d.action, d.outcome)] += d.count;
	}
	const result: MemberActivity[] = [];
	for (const [userId, member] of members) {
		const readsOf = (week: string) => member.byWeek.get(week)?.read ?? 0;
		const shown = weekStarts.slice(0, weeks).map((week, i) => {
			const counts = member.byWeek.get(week) ?? zero();
			const baselineReads = median(weekStarts.slice(i + 1, i + 5).map(readsOf));
			return {
				week,
				counts,
				baselineReads,
				unusual: counts.read >= MIN_UNUSUAL_READS && counts.read > 3 * baselineReads
			};
		});
		if (shown.some((w) => ACTIVITY_KINDS.some((k) => w.counts[k] > 0))) {
			result.push({ userId, name: member.name, weeks: shown });
		}
	}
	return result.sort((a, b) => b.weeks[0]!.counts.read - a.weeks[0]!.counts.read);
}
