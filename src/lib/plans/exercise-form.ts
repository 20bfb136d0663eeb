// The studio's own exercise as a form: its words for people, and the parser from posted fields
// to the API's shape (`exerciseCreateSchema`), shared by the form action and its tests.
import { parseForm, textOf, type FormResult, type FormValues } from '$lib/forms';
import { exerciseCreateSchema, type ExerciseCreateInput } from './schemas';
import { EXERCISE_WORDS } from './exercise-words';

export { EXERCISE_WORDS };

export const EXERCISE_LISTS = ['categories', 'alternativeIds'] as const;

export function exerciseFromForm(values: FormValues): FormResult<ExerciseCreateInput> {
	const list = (key: string) => {
		const v = values[key];
		return (Array.isArray(v) ? v : v ? [v] : []).filter(Boolean);
	};
	const difficulty = Number(textOf(values, 'difficulty'));
	const body = {
		name: textOf(values, 'name'),
		description: textOf(values, 'description'),
		position: textOf(values, 'position') || undefined,
		difficulty: Number.isInteger(difficulty) && difficulty > 0 ? difficulty : undefined,
		categories: list('categories'),
		alternativeIds: list('alternativeIds').slice(0, 3),
		...(textOf(values, 'why') ? { why: textOf(values, 'why') } : {}),
		...(textOf(values, 'copiedFrom') ? { copiedFrom: textOf(values, 'copiedFrom') } : {})
	};
	return parseForm(exerciseCreateSchema, body, values, { words: EXERCISE_WORDS });
}
