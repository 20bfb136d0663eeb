import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { SHIPPED_EXERCISES, type Exercise } from './exercises/exercise';
import { effectiveLimits } from './limits';
import {
	MOVEMENT_CATEGORIES,
	type CategoryLimit,
	type EffectiveLimits,
	type EffectiveLevel,
	type LimitAuthor,
	type MovementCategory
} from './movement';
import {
	checkPlan,
	findAlternative,
	judgeExercise,
	PLAN_CHECK_SOURCES,
	PREGNANCY_SUPINE_NOTE,
	type ClientWithLimits
} from './plan-check';

// Effective limits built by hand from the contract types: the check must take levels as given.
const NO_LIMIT: CategoryLimit = {
	level: 'no_limit',
	reason: 'No limit from screenings and no clinician’s decision yet',
	source: 'Seamwell’s provisional rules hold nothing here',
	by: 'screening'
};

function limits(
	set: Partial<Record<MovementCategory, Partial<CategoryLimit>>> = {},
	extra: Partial<EffectiveLimits> = {}
): EffectiveLimits {
	const categories = Object.fromEntries(
		MOVEMENT_CATEGORIES.map((c) => [c, { ...NO_LIMIT, ...set[c] }])
	) as EffectiveLimits['categories'];
	return {
		categories,
		provisional: !Object.values(categories).some((l) => l.by === 'clinician'),
		seeDoctorFirst: false,
		newFindings: [],
		reviewOverdue: false,
		clearanceLapsed: false,
		prompts: [],
		...extra
	};
}

const clinicianHold = (reason = 'Wait until the gap narrows'): Partial<CategoryLimit> => ({
	level: 'hold',
	by: 'clinician',
	reason,
	source: 'Clearance by Ines Marlow, Fernbank Pelvic Health'
});
const screeningHold: Partial<CategoryLimit> = {
	level: 'hold',
	by: 'screening',
	reason: 'Latest screening says refer',
	source: 'Common practice: avoid repeated loaded forward flexion while a gap is healing'
};
const cleared: Partial<CategoryLimit> = {
	level: 'cleared',
	by: 'clinician',
	reason: 'Cleared',
	source: 'Clearance by Ines Marlow'
};

function client(
	id: string,
	l: EffectiveLimits,
	stage: 'pregnant' | 'postpartum' = 'postpartum'
): ClientWithLimits {
	return { clientId: id, stage, limits: l };
}

const library = SHIPPED_EXERCISES;
const ex = (id: string) => {
	const found = library.find((e) => e.id === id);
	if (!found) throw new Error(id);
	return found;
};

describe('checkPlan — statuses', () => {
	it('answers ok with "no clinician’s decision yet" where levels are no_limit', () => {
		const cell = checkPlan(
			{ items: [{ exerciseId: 'curl-up' }] },
			[client('a', limits())],
			library
		)[0]!;
		expect(cell).toMatchObject({ status: 'ok', overridable: false, exerciseId: 'curl-up' });
		expect(cell.reason).toMatch(/no clinician’s decision yet for Loaded spinal flexion/i);
		expect(cell.alternativeExerciseId).toBeUndefined();
	});

	it('answers ok naming the clearance where every loaded category is cleared', () => {
		const verdict = judgeExercise(ex('curl-up'), client('a', limits({ loaded_flexion: cleared })));
		expect(verdict).toMatchObject({ status: 'ok', by: 'clinician' });
		expect(verdict.reason).toMatch(/^Cleared: Loaded spinal flexion$/);
		expect(verdict.source).toBe('Clearance by Ines Marlow');
	});

	it('blocks an exercise when any category it loads is on hold, with reason, source and who', () => {
		const cells = checkPlan(
			{ items: [{ exerciseId: 'curl-up' }, { exerciseId: 'heel-slides' }] },
			[client('hana', limits({ loaded_flexion: clinicianHold() })), client('bea', limits())],
			library
		);
		const hana = cells.find((c) => c.clientId === 'hana' && c.itemIndex === 0)!;
		expect(hana).toMatchObject({ status: 'blocked', by: 'clinician', overridable: false });
		expect(hana.reason).toContain('Loaded spinal flexion on hold');
		expect(hana.reason).toContain('clinician’s clearance');
		expect(hana.source).toBe('Clearance by Ines Marlow, Fernbank Pelvic Health');
		// the first listed alternative, which is allowed for her
		expect(hana.alternativeExerciseId).toBe('back-lying-breath-deep-core');
		expect(cells.find((c) => c.clientId === 'bea' && c.itemIndex === 0)!.status).toBe('ok');
		expect(cells.find((c) => c.clientId === 'hana' && c.itemIndex === 1)!.status).toBe('ok');
		expect(cells).toHaveLength(4);
	});

	it('modifies with the clinician’s modification text, every one listed', () => {
		const cell = checkPlan(
			{ items: [{ exerciseId: 'oblique-curl-up' }] },
			[
				client(
					'a',
					limits({
						loaded_flexion: {
							level: 'modify',
							by: 'clinician',
							reason: 'Modify',
							source: 'Clearance',
							modification: 'Small range, head supported'
						},
						loaded_rotation: {
							level: 'modify',
							by: 'clinician',
							reason: 'Modify',
							source: 'Clearance',
							modification: 'No weight'
						}
					})
				)
			],
			library
		)[0]!;
		expect(cell.status).toBe('modify');
		expect(cell.modification).toBe('Small range, head supported No weight');
		expect(cell.modifications.map((m) => m.text)).toEqual([
			'Small range, head supported',
			'No weight'
		]);
		expect(cell.reason).toContain('Loaded spinal flexion: modify — Small range, head supported');
		expect(cell.alternativeExerciseId).toBeUndefined();
	});

	it('a hold wins over a modify in the same exercise', () => {
		const verdict = judgeExercise(
			ex('oblique-curl-up'),
			client(
				'a',
				limits({
					loaded_flexion: { level: 'modify', modification: 'x' },
					loaded_rotation: screeningHold
				})
			)
		);
		expect(verdict.status).toBe('blocked');
	});

	it('checks the swapped exercise for the client who has a swap, and the item for the others', () => {
		const cells = checkPlan(
			{ items: [{ exerciseId: 'curl-up', swaps: { hana: 'heel-slides' } }] },
			[
				client('hana', limits({ loaded_flexion: clinicianHold() })),
				client('bea', limits({ loaded_flexion: screeningHold }))
			],
			library
		);
		expect(cells[0]).toMatchObject({
			clientId: 'hana',
			status: 'ok',
			swapped: true,
			checkedExerciseId: 'heel-slides'
		});
		expect(cells[1]).toMatchObject({ clientId: 'bea', status: 'blocked', swapped: false });
	});

	it('blocks an exercise that is no longer in the library, not overridable', () => {
		const cell = checkPlan(
			{ items: [{ exerciseId: 'gone' }] },
			[client('a', limits())],
			library
		)[0]!;
		expect(cell).toMatchObject({ status: 'blocked', overridable: false });
	});
});

describe('checkPlan — overridable', () => {
	it('is overridable when every hold is the studio’s provisional limit (screening, record, self-report)', () => {
		for (const by of ['screening', 'record', 'self_report'] as LimitAuthor[]) {
			const verdict = judgeExercise(
				ex('curl-up-bicycle'),
				client(
					'a',
					limits({ loaded_flexion: { ...screeningHold, by }, long_lever: { ...screeningHold, by } })
				)
			);
			expect(verdict.status).toBe('blocked');
			expect(verdict.overridable, by).toBe(true);
		}
	});

	it('is not overridable when any hold behind the block is a clinician’s', () => {
		const verdict = judgeExercise(
			ex('curl-up-bicycle'),
			client('a', limits({ loaded_flexion: screeningHold, long_lever: clinicianHold() }))
		);
		expect(verdict).toMatchObject({ status: 'blocked', overridable: false, by: 'clinician' });
		expect(verdict.holds.map((h) => h.category)).toEqual(['loaded_flexion', 'long_lever']);
	});

	it('is never overridable for a "see a doctor first" hold, on the category or the whole record', () => {
		const onCategory = judgeExercise(
			ex('curl-up'),
			client('a', limits({ loaded_flexion: { ...screeningHold, seeDoctorFirst: true } }))
		);
		expect(onCategory).toMatchObject({ status: 'blocked', overridable: false });
		expect(onCategory.reason).toContain('see a doctor first');
		const everything = Object.fromEntries(
			MOVEMENT_CATEGORIES.map((c) => [c, { ...screeningHold, by: 'screening' as const }])
		);
		const onRecord = judgeExercise(
			ex('curl-up'),
			client('a', limits(everything, { seeDoctorFirst: true }))
		);
		expect(onRecord.overridable).toBe(false);
	});
});

describe('checkPlan — pregnancy', () => {
	it('adds the lying-on-the-back note to supine work for a pregnant client', () => {
		// Mottola MF et al. 2019 Canadian guideline (secondary source): change position if she
		// feels light-headed or unwell lying on her back
		const verdict = judgeExercise(ex('heel-slides'), client('a', limits(), 'pregnant'));
		expect(verdict.status).toBe('modify');
		expect(verdict.modifications).toEqual([
			{ text: PREGNANCY_SUPINE_NOTE, source: PLAN_CHECK_SOURCES.pregnancySupine }
		]);
		expect(verdict.source).toContain('Mottola');
		expect(judgeExercise(ex('heel-slides'), client('a', limits(), 'postpartum')).status).toBe('ok');
		expect(judgeExercise(ex('seated-march'), client('a', limits(), 'pregnant')).status).toBe('ok');
	});

	it('keeps both the clinician’s modification and the note', () => {
		const verdict = judgeExercise(
			ex('curl-up'),
			client(
				'a',
				limits({
					loaded_flexion: { level: 'modify', by: 'clinician', modification: 'Head on a pillow' }
				}),
				'pregnant'
			)
		);
		expect(verdict.modifications.map((m) => m.text)).toEqual([
			'Head on a pillow',
			PREGNANCY_SUPINE_NOTE
		]);
	});
});

describe('checkPlan — alternatives', () => {
	it('skips a listed alternative that is itself held, and takes the next', () => {
		// curl-up lists back-lying-breath-deep-core then heel-slides; both are deep_stability
		const custom: Exercise = {
			...ex('heel-slides'),
			id: 'custom-1',
			slug: 'x',
			alternativeIds: ['curl-up', 'face-down-chest-lift', 'heel-slides'],
			categories: ['long_lever'],
			custom: true
		};
		const alt = findAlternative(
			custom,
			client(
				'a',
				limits({
					long_lever: screeningHold,
					loaded_flexion: screeningHold,
					loaded_extension: screeningHold
				})
			),
			[...library, custom]
		);
		expect(alt).toEqual({ exerciseId: 'heel-slides' });
	});

	it('without a listed one, takes the nearest: same position, then closest difficulty', () => {
		const custom: Exercise = {
			...ex('curl-up'),
			id: 'custom-2',
			slug: 'y',
			alternativeIds: [],
			position: 'side_lying',
			difficulty: 2,
			custom: true
		};
		const alt = findAlternative(custom, client('a', limits({ loaded_flexion: screeningHold })), [
			...library,
			custom
		]);
		// side-lying at the same difficulty 2, first in library order — common practice, no source
		expect(alt.exerciseId).toBe('side-lying-leg-circles');
	});

	it('falls back to an exercise at modify, with its modification, and never one on hold', () => {
		const l = limits({
			loaded_flexion: clinicianHold(),
			deep_stability: { level: 'modify', by: 'clinician', modification: 'Half range only' }
		});
		const alt = findAlternative(ex('curl-up'), client('a', l), library);
		expect(alt.exerciseId).toBeDefined();
		const chosen = ex(alt.exerciseId!);
		expect(chosen.categories).not.toContain('loaded_flexion');
		// every non-held exercise loads deep_stability or a no_limit category; the first allowed wins
		expect(judgeExercise(chosen, client('a', l)).status).not.toBe('blocked');
	});

	it('says so when nothing in the library is allowed', () => {
		const everything = Object.fromEntries(
			MOVEMENT_CATEGORIES.map((c) => [c, { ...screeningHold, seeDoctorFirst: true }])
		);
		const cell = checkPlan(
			{ items: [{ exerciseId: 'curl-up' }] },
			[client('a', limits(everything, { seeDoctorFirst: true }))],
			library
		)[0]!;
		expect(cell.alternativeExerciseId).toBeUndefined();
		expect(cell.alternativeNote).toMatch(/No exercise in the library is allowed/);
	});
});

describe('checkPlan — the provisional rules reach the check', () => {
	it('8 weeks after a vaginal birth, impact is held by the studio’s rule: blocked, overridable', () => {
		// Goom T, Donnelly G, Brockwell E. Returning to running postnatal, 2019 — impact waits
		// until 12 weeks after the birth
		const limits = effectiveLimits(
			{
				stage: 'postpartum',
				dueDate: null,
				birthDate: '2026-01-01',
				delivery: 'vaginal',
				postnatalCheckOn: '2026-02-12',
				postnatalCleared: true
			},
			[],
			null,
			'2026-02-26'
		);
		const jog = judgeExercise(ex('jog-on-the-spot'), client('a', limits));
		expect(jog).toMatchObject({ status: 'blocked', overridable: true });
		expect(jog.holds.map((h) => h.category)).toEqual(['impact']);
		expect(jog.source).toContain('Goom');
		expect(judgeExercise(ex('heel-slides'), client('a', limits)).status).toBe('ok');
	});
});

describe('checkPlan — properties over the whole shipped library', () => {
	const levelArb = fc.constantFrom<EffectiveLevel>('cleared', 'modify', 'hold', 'no_limit');
	const byArb = fc.constantFrom<LimitAuthor>('clinician', 'screening', 'record', 'self_report');
	const limitArb = fc.record({
		level: levelArb,
		by: byArb,
		seeDoctorFirst: fc.boolean(),
		modification: fc.constantFrom('Smaller range', 'No weight')
	});
	const limitsArb = fc.record(
		Object.fromEntries(MOVEMENT_CATEGORIES.map((c) => [c, limitArb])) as Record<
			MovementCategory,
			typeof limitArb
		>
	);
	const stageArb = fc.constantFrom<'pregnant' | 'postpartum'>('pregnant', 'postpartum');

	it('alternatives never load a held category; statuses and overridable follow the levels', () => {
		fc.assert(
			fc.property(limitsArb, stageArb, (set, stage) => {
				const c = client('a', limits(set), stage);
				const held = new Set(MOVEMENT_CATEGORIES.filter((k) => set[k].level === 'hold'));
				const cells = checkPlan(
					{ items: library.map((e) => ({ exerciseId: e.id })) },
					[c],
					library
				);
				for (const cell of cells) {
					const exercise = ex(cell.exerciseId);
					const holds = exercise.categories.filter((k) => held.has(k));
					expect(cell.status === 'blocked').toBe(holds.length > 0);
					if (cell.status !== 'blocked') continue;
					expect(cell.overridable).toBe(
						holds.every((k) => set[k].by !== 'clinician' && !set[k].seeDoctorFirst)
					);
					if (cell.alternativeExerciseId) {
						const alt = ex(cell.alternativeExerciseId);
						expect(alt.id).not.toBe(exercise.id);
						expect(alt.categories.filter((k) => held.has(k))).toEqual([]);
						if (!cell.alternativeModification) {
							for (const k of alt.categories)
								expect(['cleared', 'no_limit']).toContain(set[k].level);
						}
					} else {
						// none found: truly nothing in the library is free of held categories
						expect(cell.alternativeNote).toBeDefined();
						expect(
							library.filter((e) => e.id !== exercise.id && e.categories.every((k) => !held.has(k)))
						).toEqual([]);
					}
				}
			}),
			{ numRuns: 100 }
		);
	}, 120_000);
});
