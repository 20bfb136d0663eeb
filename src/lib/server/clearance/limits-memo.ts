import type { EffectiveLimits } from '../../domain/movement';

// Effective limits are a pure function of a client's record, screenings, clearance,
// self-reports and the day; a list, a class plan or a client page asks for the same clients
// again and again. The memo keeps each result under the client's limits version, which
// database triggers change whenever any of those inputs changes (migration 0013), so a hit is
// never stale whichever process or path wrote the change. Two things are not in the version
// and are bounded by age instead: the names of the physiotherapist and clinic quoted in the
// reasons (a rename shows within `MAX_AGE_MS`).
//
// One memo per app process; entries are frozen, so no caller can change another's answer.

export type SelfReportScope = 'shared' | 'all' | 'none';

const MAX_ENTRIES = 20_000;
const MAX_AGE_MS = 10 * 60_000;

type Entry = { limits: EffectiveLimits; storedAt: number };

const entries = new Map<string, Entry>();

function keyOf(clientId: string, version: number, today: string, scope: SelfReportScope): string {
	return `${clientId}|${version}|${today}|${scope}`;
}

export function recalledLimits(
	clientId: string,
	version: number,
	today: string,
	scope: SelfReportScope,
	now = Date.now()
): EffectiveLimits | undefined {
	const key = keyOf(clientId, version, today, scope);
	const entry = entries.get(key);
	if (!entry) return undefined;
	if (now - entry.storedAt > MAX_AGE_MS) {
		entries.delete(key);
		return undefined;
	}
	return entry.limits;
}

export function rememberLimits(
	clientId: string,
	version: number,
	today: string,
	scope: SelfReportScope,
	limits: EffectiveLimits,
	now = Date.now()
): EffectiveLimits {
	const frozen = deepFreeze(limits);
	// A Map keeps insertion order: when full, the oldest entries go first.
	while (entries.size >= MAX_ENTRIES) {
		const oldest = entries.keys().next().value;
		if (oldest === undefined) break;
		entries.delete(oldest);
	}
	entries.set(keyOf(clientId, version, today, scope), { limits: frozen, storedAt: now });
	return frozen;
}

/** For tests: how many results are held. */
export function memoSize(): number {
	return entries.size;
}

function deepFreeze<T>(value: T): T {
	if (value && typeof value === 'object' && !Object.isFrozen(value)) {
		Object.freeze(value);
		for (const inner of Object.values(value)) deepFreeze(inner);
	}
	return value;
}
