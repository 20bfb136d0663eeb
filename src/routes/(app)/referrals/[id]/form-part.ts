import { formatDateLong } from '$lib/dates';
// What the physiotherapist's two forms share: the values and errors a failed post sends back,
// and how the page writes a day.
export type FormPart = {
	values: Record<string, string | string[]>;
	errors: Record<string, string>;
};

export const val = (part: FormPart | null, key: string): string | undefined => {
	const v = part?.values[key];
	return typeof v === 'string' ? v : undefined;
};

export const err = (part: FormPart | null, key: string) => part?.errors[key];

export const dayOf = formatDateLong;
