/** The three places an instructor presses into the midline, top to bottom. */
export const SITES = ['above_navel', 'at_navel', 'below_navel'] as const;
export type Site = (typeof SITES)[number];

export const SITE_LABELS: Record<Site, string> = {
	above_navel: 'above the navel',
	at_navel: 'at the navel',
	below_navel: 'below the navel'
};

export const DEPTHS = ['shallow', 'moderate', 'deep'] as const;
export type Depth = (typeof DEPTHS)[number];

export const TENSIONS = ['firm', 'soft'] as const;
export type Tension = (typeof TENSIONS)[number];

/** One site of one screening, as the instructor felt it during the curl-up. */
export interface SiteMeasure {
	widthFingers: number;
	/** Only when the examiner measured it; never derived from finger widths. */
	widthMm?: number | null;
	depth: Depth;
	tension: Tension;
	doming: boolean;
}

/** The finger-width test reads in half steps from closed to six fingers. */
export const FINGER_WIDTH_MIN = 0;
export const FINGER_WIDTH_MAX = 6;
export const FINGER_WIDTH_STEP = 0.5;

export function isValidFingerWidth(value: number): boolean {
	return (
		Number.isFinite(value) &&
		value >= FINGER_WIDTH_MIN &&
		value <= FINGER_WIDTH_MAX &&
		Number.isInteger(value / FINGER_WIDTH_STEP)
	);
}

/** "1 finger width", "1.5 finger widths", "2 finger widths". */
export function formatFingerWidths(value: number): string {
	return `${value} finger ${value === 1 ? 'width' : 'widths'}`;
}

/** "Above the navel", for the start of a sentence. */
export function siteLabelCapitalised(site: Site): string {
	const label = SITE_LABELS[site];
	return label.charAt(0).toUpperCase() + label.slice(1);
}
