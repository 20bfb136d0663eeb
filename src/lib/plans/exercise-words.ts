import type { FormWords } from '$lib/forms';

// The studio exercise form's words, without zod (see ./exercise-form.ts).

export const EXERCISE_WORDS: FormWords = {
	name: { label: 'Name', missing: 'Give the exercise a name' },
	description: {
		label: 'How to do it',
		missing: 'Say how to do it, what to feel and one cue'
	},
	position: { label: 'Position', missing: 'Choose the position' },
	difficulty: { label: 'Difficulty', missing: 'Choose a difficulty from 1 to 3' },
	categories: { label: 'What it loads', missing: 'Tick at least one movement category' },
	alternativeIds: { label: 'Alternatives' },
	why: { label: 'Why these categories' }
};
