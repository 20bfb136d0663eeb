import { asc, inArray } from 'drizzle-orm';
import { z } from 'zod';
import { SHIPPED_EXERCISES, type Exercise } from '$lib/domain/exercises/exercise';
import { STOP_SIGNS_TEXT } from '$lib/domain/exercises/library';
import type { ExerciseCreateInput } from '$lib/plans/schemas';
import { recordAccess } from '../audit';
import { type Caller } from '../context';
import { db, type Executor } from '../db';
import { studioExercises } from '../db/schema';
import { fieldProblem } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { mayUsePlans, studioForNew } from './policy';
import { refuseUse } from './shared';
import { instructorStudioIds } from '../scope';

// ── Library ─────────────────────────────────────────────────────────────────────────────

function customToExercise(row: typeof studioExercises.$inferSelect): Exercise {
	return {
		id: row.id,
		slug: row.slug,
		name: row.name,
		description: row.description,
		position: row.position,
		difficulty: row.difficulty as 1 | 2 | 3,
		categories: row.categories,
		alternativeIds: row.alternativeIds,
		custom: true,
		why: row.why,
		stopSigns: STOP_SIGNS_TEXT
	};
}

/** The shipped library and the studio's own exercises, shipped first. */
export async function libraryFor(
	executor: Executor,
	studioIds: readonly string[]
): Promise<Exercise[]> {
	if (studioIds.length === 0) return [...SHIPPED_EXERCISES];
	const rows = await executor
		.select()
		.from(studioExercises)
		.where(inArray(studioExercises.organisationId, [...studioIds]))
		.orderBy(asc(studioExercises.name));
	return [...SHIPPED_EXERCISES, ...rows.map(customToExercise)];
}

export interface ExerciseQuery {
	category?: Exercise['categories'][number];
	position?: Exercise['position'];
	difficulty?: number;
	q?: string;
	limit: number;
	cursor?: string;
}

const offsetCursor = z.object({ o: z.number().int().min(0) });

/** Policy: mayUsePlans (the shipped library and her studios' own). Audit: none — no client data. */
export async function listExercises(caller: Caller, query: ExerciseQuery): Promise<Page<Exercise>> {
	if (!mayUsePlans(caller.actor)) return refuseUse(caller, 'access.denied');
	const library = await libraryFor(db(), instructorStudioIds(caller.actor));
	const q = query.q?.trim().toLowerCase();
	const matching = library.filter(
		(e) =>
			(!query.category || e.categories.includes(query.category)) &&
			(!query.position || e.position === query.position) &&
			(!query.difficulty || e.difficulty === query.difficulty) &&
			(!q || e.name.toLowerCase().includes(q) || e.description.toLowerCase().includes(q))
	);
	const offset = decodeCursor(query.cursor, offsetCursor)?.o ?? 0;
	const rows = matching.slice(offset, offset + query.limit + 1);
	return toPage(rows, query.limit, () => ({ o: offset + query.limit }));
}

/** Policy: mayUsePlans (the whole library she can see). Audit: none — no client data. */
export async function exerciseLibrary(caller: Caller): Promise<Exercise[]> {
	if (!mayUsePlans(caller.actor)) return refuseUse(caller, 'access.denied');
	return libraryFor(db(), instructorStudioIds(caller.actor));
}

function slugify(name: string): string {
	const base = name
		.toLowerCase()
		.normalize('NFKD')
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 60);
	return `studio-${base || 'exercise'}`;
}

/** Policy: studioForNew (an instructor of the studio). Audit: exercise.created (no client). */
export async function createExercise(
	caller: Caller,
	input: ExerciseCreateInput
): Promise<{ id: string }> {
	const studio = studioForNew(caller.actor);
	if (!studio) return refuseUse(caller, 'exercise.created');
	return db().transaction(async (tx) => {
		const library = await libraryFor(tx, [studio]);
		const known = new Set(library.map((e) => e.id));
		const missing = input.alternativeIds.findIndex((id) => !known.has(id));
		if (missing >= 0) {
			throw fieldProblem(
				`/alternativeIds/${missing}`,
				'no such exercise in your library',
				'An alternative names an exercise that is not in your studio’s library.'
			);
		}
		if (input.copiedFrom && !known.has(input.copiedFrom)) {
			throw fieldProblem('/copiedFrom', 'no such exercise', 'No such exercise to copy from.');
		}
		let slug = slugify(input.name);
		const taken = new Set(library.map((e) => e.slug));
		for (let n = 2; taken.has(slug); n++) slug = `${slugify(input.name)}-${n}`;
		const [row] = await tx
			.insert(studioExercises)
			.values({
				organisationId: studio,
				slug,
				name: input.name,
				description: input.description,
				position: input.position,
				difficulty: input.difficulty,
				categories: input.categories,
				alternativeIds: input.alternativeIds,
				why: input.why?.trim() ?? '',
				copiedFrom: input.copiedFrom ?? null,
				createdBy: caller.actor.userId
			})
			.returning({ id: studioExercises.id });
		await recordAccess(tx, caller.access, {
			action: 'exercise.created',
			outcome: 'success',
			target: { type: 'exercise', id: row!.id }
		});
		return { id: row!.id };
	});
}
