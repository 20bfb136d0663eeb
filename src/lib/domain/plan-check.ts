import type { Exercise } from './exercises/exercise';
import {
	MOVEMENT_CATEGORY_LABELS,
	type CategoryLimit,
	type EffectiveLimits,
	type LimitAuthor,
	type MovementCategory
} from './movement';
import type { Stage } from './stage';

/**
 * Checking a session plan against every client's effective limits. Levels come only from the
 * clearance issue's `effectiveLimits`; nothing here re-derives a level. The more cautious rule
 * always wins: any held category blocks, any modified one modifies.
 */

export const PLAN_CHECK_SOURCES = {
	pregnancySupine:
		'Mottola MF et al. 2019 Canadian guideline for physical activity throughout pregnancy (seen in a secondary source) — change position if she feels light-headed or unwell lying on her back',
	missingExercise: 'Seamwell: the exercise is not in this studio’s library'
} as const;

export const PREGNANCY_SUPINE_NOTE =
	'Change position if she feels light-headed or unwell lying on her back.';

export type CellStatus = 'ok' | 'modify' | 'blocked';

export interface PlanCheckItem {
	exerciseId: string;
	/** clientId → the exercise she does instead. */
	swaps?: Record<string, string>;
}

export interface PlanCheckInput {
	items: readonly PlanCheckItem[];
}

export interface ClientWithLimits {
	clientId: string;
	stage: Stage;
	limits: EffectiveLimits;
}

/** A hold behind a blocked cell, as the screens and the override rule need it. */
export interface CellHold {
	category: MovementCategory;
	by: LimitAuthor;
	reason: string;
	source: string;
	seeDoctorFirst: boolean;
}

export interface CellModification {
	/** Absent for the pregnancy note, which is about position, not a category. */
	category?: MovementCategory;
	text: string;
	source: string;
}

export interface PlanCell {
	clientId: string;
	itemIndex: number;
	/** The plan item's exercise (the grid's row). */
	exerciseId: string;
	/** What she actually does: the swap for her, if any, else the item's exercise. */
	checkedExerciseId: string;
	swapped: boolean;
	status: CellStatus;
	reason: string;
	source: string;
	by: LimitAuthor | null;
	/** True only when every hold behind the block is the studio's own provisional limit. */
	overridable: boolean;
	/** All modification texts, in category order, joined. */
	modification?: string;
	modifications: CellModification[];
	holds: CellHold[];
	alternativeExerciseId?: string;
	/** Set when the alternative itself needs modifying: what to change. */
	alternativeModification?: string;
	/** Set when no allowed alternative exists. */
	alternativeNote?: string;
}

export interface Verdict {
	status: CellStatus;
	reason: string;
	source: string;
	by: LimitAuthor | null;
	overridable: boolean;
	modifications: CellModification[];
	holds: CellHold[];
}

const label = (category: MovementCategory) => MOVEMENT_CATEGORY_LABELS[category];

function unique(values: string[]): string[] {
	return [...new Set(values.filter((v) => v.length > 0))];
}

function isMedicalHold(limit: CategoryLimit, limits: EffectiveLimits): boolean {
	return limit.seeDoctorFirst === true || limits.seeDoctorFirst;
}

/** One exercise for one client: the verdict from her effective levels alone. */
export function judgeExercise(exercise: Exercise, client: ClientWithLimits): Verdict {
	const categories = exercise.categories;
	const limitOf = (c: MovementCategory) => client.limits.categories[c];

	const holds: CellHold[] = categories
		.filter((c) => limitOf(c).level === 'hold')
		.map((c) => ({
			category: c,
			by: limitOf(c).by,
			reason: limitOf(c).reason,
			source: limitOf(c).source,
			seeDoctorFirst: isMedicalHold(limitOf(c), client.limits)
		}));
	if (holds.length > 0) {
		const byClinician = holds.find((h) => h.by === 'clinician');
		return {
			status: 'blocked',
			reason: holds
				.map(
					(h) =>
						`${label(h.category)} on hold — ${h.reason} (${h.by === 'clinician' ? 'clinician’s clearance' : h.seeDoctorFirst ? 'see a doctor first' : 'studio’s provisional limit'})`
				)
				.join('; '),
			source: unique(holds.map((h) => h.source)).join('; '),
			by: (byClinician ?? holds[0]!).by,
			overridable: holds.every((h) => h.by !== 'clinician' && !h.seeDoctorFirst),
			modifications: [],
			holds
		};
	}

	const modifications: CellModification[] = categories
		.filter((c) => limitOf(c).level === 'modify')
		.map((c) => ({
			category: c,
			text: limitOf(c).modification?.trim() || limitOf(c).reason,
			source: limitOf(c).source
		}));
	if (client.stage === 'pregnant' && exercise.position === 'supine') {
		modifications.push({ text: PREGNANCY_SUPINE_NOTE, source: PLAN_CHECK_SOURCES.pregnancySupine });
	}
	if (modifications.length > 0) {
		const firstCategory = categories.find((c) => limitOf(c).level === 'modify');
		return {
			status: 'modify',
			reason: modifications
				.map((m) => (m.category ? `${label(m.category)}: modify — ${m.text}` : m.text))
				.join('; '),
			source: unique(modifications.map((m) => m.source)).join('; '),
			by: firstCategory ? limitOf(firstCategory).by : null,
			overridable: false,
			modifications,
			holds: []
		};
	}

	const undecided = categories.filter((c) => limitOf(c).level === 'no_limit');
	const cleared = categories.filter((c) => limitOf(c).level === 'cleared');
	const parts: string[] = [];
	if (cleared.length > 0) parts.push(`Cleared: ${cleared.map(label).join(', ')}`);
	if (undecided.length > 0) {
		parts.push(`no clinician’s decision yet for ${undecided.map(label).join(', ')}`);
	}
	const reason = parts.join('; ');
	return {
		status: 'ok',
		reason: reason.charAt(0).toUpperCase() + reason.slice(1),
		source: unique(categories.map((c) => limitOf(c).source)).join('; '),
		by: cleared.length > 0 && undecided.length === 0 ? limitOf(cleared[0]!).by : null,
		overridable: false,
		modifications: [],
		holds: []
	};
}

/**
 * Library exercises in the order an alternative is looked for: the exercise's own listed
 * alternatives first, then the rest by nearness — same position, then closest difficulty
 * (the easier one on a tie), then library order.
 */
function candidatesFor(exercise: Exercise, library: readonly Exercise[], exclude: Set<string>) {
	const byId = new Map(library.map((e) => [e.id, e]));
	const listed = exercise.alternativeIds
		.map((id) => byId.get(id))
		.filter((e): e is Exercise => e !== undefined && !exclude.has(e.id));
	const listedIds = new Set(listed.map((e) => e.id));
	const rest = library
		.map((e, index) => ({ e, index }))
		.filter(({ e }) => !exclude.has(e.id) && !listedIds.has(e.id))
		.sort(
			(a, b) =>
				Number(a.e.position !== exercise.position) - Number(b.e.position !== exercise.position) ||
				Math.abs(a.e.difficulty - exercise.difficulty) -
					Math.abs(b.e.difficulty - exercise.difficulty) ||
				a.e.difficulty - b.e.difficulty ||
				a.index - b.index
		)
		.map(({ e }) => e);
	return [...listed, ...rest];
}

export interface AlternativeChoice {
	exerciseId?: string;
	modification?: string;
	note?: string;
}

/**
 * A safer exercise for her: the first candidate that is fully allowed (every category cleared or
 * without limit); failing that, the first that needs only modifying, with what to change;
 * never one that loads a category held for her.
 */
export function findAlternative(
	exercise: Exercise,
	client: ClientWithLimits,
	library: readonly Exercise[],
	exclude: readonly string[] = [],
	judge: (e: Exercise) => Verdict = (e) => judgeExercise(e, client)
): AlternativeChoice {
	const candidates = candidatesFor(exercise, library, new Set([exercise.id, ...exclude]));
	let modifiable: { exercise: Exercise; verdict: Verdict } | undefined;
	for (const candidate of candidates) {
		const verdict = judge(candidate);
		if (verdict.status === 'ok') return { exerciseId: candidate.id };
		if (verdict.status === 'modify' && !modifiable) modifiable = { exercise: candidate, verdict };
	}
	if (modifiable) {
		return {
			exerciseId: modifiable.exercise.id,
			modification: modifiable.verdict.modifications.map((m) => m.text).join(' ')
		};
	}
	return { note: 'No exercise in the library is allowed for her here: remove it for her.' };
}

function missingCell(clientId: string, itemIndex: number, exerciseId: string, checked: string) {
	return {
		clientId,
		itemIndex,
		exerciseId,
		checkedExerciseId: checked,
		swapped: checked !== exerciseId,
		status: 'blocked' as const,
		reason: 'This exercise is not in the studio’s library any more: remove or replace it.',
		source: PLAN_CHECK_SOURCES.missingExercise,
		by: null,
		overridable: false,
		modifications: [],
		holds: []
	};
}

/**
 * Every client × every item of the plan. A client's swap replaces the item's exercise for her
 * and is checked like any other. Blocked cells carry an alternative.
 */
export function checkPlan(
	plan: PlanCheckInput,
	clientsWithLimits: readonly ClientWithLimits[],
	library: readonly Exercise[]
): PlanCell[] {
	const byId = new Map(library.map((e) => [e.id, e]));
	// One verdict per client and exercise, however often the alternative search asks for it.
	const judges = clientsWithLimits.map((client) => {
		const cache = new Map<string, Verdict>();
		return (e: Exercise) => {
			let verdict = cache.get(e.id);
			if (!verdict) cache.set(e.id, (verdict = judgeExercise(e, client)));
			return verdict;
		};
	});
	const cells: PlanCell[] = [];
	plan.items.forEach((item, itemIndex) => {
		clientsWithLimits.forEach((client, clientIndex) => {
			const judge = judges[clientIndex]!;
			const checkedId = item.swaps?.[client.clientId] ?? item.exerciseId;
			const exercise = byId.get(checkedId);
			if (!exercise) {
				cells.push(missingCell(client.clientId, itemIndex, item.exerciseId, checkedId));
				return;
			}
			const verdict = judge(exercise);
			const cell: PlanCell = {
				clientId: client.clientId,
				itemIndex,
				exerciseId: item.exerciseId,
				checkedExerciseId: checkedId,
				swapped: checkedId !== item.exerciseId,
				...verdict
			};
			if (verdict.modifications.length > 0) {
				cell.modification = verdict.modifications.map((m) => m.text).join(' ');
			}
			if (verdict.status === 'blocked') {
				const alternative = findAlternative(exercise, client, library, [item.exerciseId], judge);
				if (alternative.exerciseId) cell.alternativeExerciseId = alternative.exerciseId;
				if (alternative.modification) cell.alternativeModification = alternative.modification;
				if (alternative.note) cell.alternativeNote = alternative.note;
			}
			cells.push(cell);
		});
	});
	return cells;
}

/** The blocked cells a studio override may not cover. */
export function unoverridableCells(cells: readonly PlanCell[]): PlanCell[] {
	return cells.filter((c) => c.status === 'blocked' && !c.overridable);
}
