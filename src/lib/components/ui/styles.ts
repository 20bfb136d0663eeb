// The UI kit's class strings, in one place. Components use them; a link that looks like a
// button (`<a class={buttonClass('secondary')}>`) uses them too, so the look never drifts.

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'quiet';
export type ButtonSize = 'md' | 'sm';

const base =
	'inline-flex items-center justify-center gap-2 rounded-lg font-semibold whitespace-nowrap disabled:cursor-not-allowed disabled:opacity-60 aria-busy:cursor-progress';

const VARIANTS: Record<ButtonVariant, string> = {
	primary: 'bg-tide-700 text-white hover:bg-tide-900',
	secondary: 'border border-tide-700 bg-white text-tide-700 hover:bg-tide-50',
	danger: 'border border-outcome-refer bg-white text-outcome-refer hover:bg-outcome-refer-bg',
	quiet: 'text-tide-700 underline hover:text-tide-900'
};

const SIZES: Record<ButtonSize, string> = {
	md: 'min-h-11 px-4 py-2',
	sm: 'min-h-9 px-3 py-1.5 text-sm'
};

export function buttonClass(variant: ButtonVariant = 'primary', size: ButtonSize = 'md'): string {
	return `${base} ${VARIANTS[variant]} ${variant === 'quiet' ? '' : SIZES[size]}`.trim();
}

/** Text inputs, selects and text areas. */
export const INPUT_CLASS =
	'mt-1 w-full rounded-lg border border-sand-400 bg-white px-3 py-2 aria-invalid:border-outcome-refer aria-invalid:border-2';

/**
 * INPUT_CLASS with `extra` utilities. An extra margin-top, width or padding replaces the
 * base one rather than competing with it (which of two utilities wins is the stylesheet's
 * order, not the class list's).
 */
export function inputClass(extra: string): string {
	const extras = extra.split(/\s+/).filter(Boolean);
	const replaces: Record<string, RegExp> = {
		'mt-1': /^mt-/,
		'w-full': /^w-/,
		'px-3': /^px-/,
		'py-2': /^py-/
	};
	const base = INPUT_CLASS.split(' ').filter(
		(c) => !(c in replaces && extras.some((e) => replaces[c]!.test(e)))
	);
	return [...base, ...extras].join(' ');
}
