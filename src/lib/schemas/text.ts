// Text fields of every input schema (browser-safe): a string of at most `max` characters with
// no NUL, trimmed where it is stored. One definition, so every form and endpoint refuses the
// same things with the same words.
import { z } from 'zod';

/** Any text up to `max` characters, untrimmed; never a NUL character. */
export const text = (max: number) =>
	z
		.string({ error: 'must be text' })
		.max(max, `at most ${max} characters`)
		.refine((s) => !s.includes('\u0000'), 'must not contain NUL characters');

/** Trimmed, and not empty once trimmed. */
export const requiredText = (max: number) =>
	text(max)
		.transform((s) => s.trim())
		.pipe(z.string().min(1, 'required'));

/** Trimmed; empty becomes null; may be left out (undefined). */
export const optionalText = (max: number) =>
	text(max)
		.transform((s) => s.trim())
		.transform((s) => (s === '' ? null : s))
		.nullable()
		.optional();

/** As `optionalText`, but left out also becomes null: the stored value is text or null. */
export const nullableText = (max: number) => optionalText(max).transform((s) => s ?? null);
