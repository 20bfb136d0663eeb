// Builders shared by the movement-limit tests (limits.test.ts, limits-clearance.test.ts):
// invented clients, screenings and clearances, one field changed at a time.
import {
	MOVEMENT_CATEGORIES,
	type ClearanceLevel,
	type EffectiveLimits,
	type LimitsClearance,
	type LimitsClient,
	type LimitsScreening,
	type MovementCategory
} from './movement';
import type { RedFlag } from './red-flags';
import { classifyScreening } from './screening';
import type { Site, SiteMeasure } from './sites';
import type { Stage } from './stage';

export const BIRTH = '2026-04-01';

export function addDays(day: string, days: number): string {
	return new Date(new Date(day).getTime() + days * 86_400_000).toISOString().slice(0, 10);
}

export function postpartum(overrides: Partial<LimitsClient> = {}): LimitsClient {
	return {
		stage: 'postpartum',
		dueDate: null,
		birthDate: BIRTH,
		delivery: 'vaginal',
		postnatalCheckOn: addDays(BIRTH, 45),
		postnatalCleared: true,
		...overrides
	};
}

export function pregnant(): LimitsClient {
	return {
		stage: 'pregnant',
		dueDate: '2026-09-01',
		birthDate: null,
		delivery: null,
		postnatalCheckOn: null,
		postnatalCleared: null
	};
}

export function measure(widthFingers: number, overrides: Partial<SiteMeasure> = {}): SiteMeasure {
	return { widthFingers, depth: 'shallow', tension: 'firm', doming: false, ...overrides };
}

let nextId = 1;

/** A screening classified by the real rules, so outcome and reasons are what the studio stores. */
export function screening(options: {
	takenAt: string;
	recordedAt?: string;
	stage?: Stage;
	sites?: Partial<Record<Site, SiteMeasure>>;
	redFlags?: RedFlag[];
	medicalSignResolved?: boolean;
}): LimitsScreening {
	const stage = options.stage ?? 'postpartum';
	const sites: Record<Site, SiteMeasure> = {
		above_navel: options.sites?.above_navel ?? measure(1),
		at_navel: options.sites?.at_navel ?? measure(1),
		below_navel: options.sites?.below_navel ?? measure(1)
	};
	const redFlags = options.redFlags ?? [];
	const result = classifyScreening({ sites, redFlags, context: { stage } });
	return {
		id: `s${nextId++}`,
		takenAt: new Date(options.takenAt),
		recordedAt: new Date(options.recordedAt ?? options.takenAt),
		stage,
		sites,
		redFlags,
		outcome: result.outcome,
		reasons: result.reasons,
		...(options.medicalSignResolved === undefined
			? {}
			: { medicalSignResolved: options.medicalSignResolved })
	};
}

export function clearance(overrides: Partial<LimitsClearance> = {}): LimitsClearance {
	const setAt = overrides.setAt ?? new Date('2026-07-10T12:00:00Z');
	const levels = Object.fromEntries(
		MOVEMENT_CATEGORIES.map((category) => [category, 'cleared'])
	) as Record<MovementCategory, ClearanceLevel>;
	return {
		id: 'c1',
		stageAtSet: 'postpartum',
		modifications: {},
		reviewOn: '2026-09-01',
		setByName: 'Ines Varga',
		clinicName: 'Fernbank Pelvic Health',
		knownUntil: setAt,
		...overrides,
		setAt,
		levels: { ...levels, ...overrides.levels }
	};
}

export function held(limits: EffectiveLimits): MovementCategory[] {
	return MOVEMENT_CATEGORIES.filter((category) => limits.categories[category].level === 'hold');
}

export const ALL_BUT_DEEP = MOVEMENT_CATEGORIES.filter((category) => category !== 'deep_stability');
