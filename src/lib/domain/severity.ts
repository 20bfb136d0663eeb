import { EHS_2021, isPastCriterion } from './criteria';
import { SOURCES } from './sources';

export type ReinpoldGrade = 'W1' | 'W2' | 'W3';
export type KeramidasGrade = 'A' | 'B' | 'C' | 'D';

/**
 * A band of widths in mm: `lowerMm` < width (or ≤ when `lowerInclusive`), width ≤ `upperMm`
 * (or < when not `upperInclusive`); a null upper end is open.
 */
export interface SeverityBand<Grade extends string> {
	grade: Grade;
	lowerMm: number;
	lowerInclusive: boolean;
	upperMm: number | null;
	upperInclusive: boolean;
	range: string;
}

/** Reinpold et al. 2019 as published: W1 < 3 cm; W2 3 to ≤ 5 cm (3.0 cm is W2); W3 > 5 cm. */
export const REINPOLD_BANDS: readonly SeverityBand<ReinpoldGrade>[] = [
	{
		grade: 'W1',
		lowerMm: 20,
		lowerInclusive: false,
		upperMm: 30,
		upperInclusive: false,
		range: 'over 2 cm, under 3 cm'
	},
	{
		grade: 'W2',
		lowerMm: 30,
		lowerInclusive: true,
		upperMm: 50,
		upperInclusive: true,
		range: '3 cm to 5 cm inclusive'
	},
	{
		grade: 'W3',
		lowerMm: 50,
		lowerInclusive: false,
		upperMm: null,
		upperInclusive: false,
		range: 'over 5 cm'
	}
];

/**
 * Keramidas et al. 2022 give ranges with shared ends (2–3, 3–5, 5–7, 7–9 cm). Our reading, so
 * that both scales agree at 3 and 5 cm: 3.0 cm opens B (as it opens Reinpold's W2), and every
 * other shared end belongs to the lower band (5.0 cm is B, 7.0 cm is C, 9.0 cm is D). A is
 * wider than 2 cm because 2.0 cm is not diastasis (EHS 2021). Over 9 cm has no grade.
 */
export const KERAMIDAS_BANDS: readonly SeverityBand<KeramidasGrade>[] = [
	{
		grade: 'A',
		lowerMm: 20,
		lowerInclusive: false,
		upperMm: 30,
		upperInclusive: false,
		range: 'over 2 cm, under 3 cm'
	},
	{
		grade: 'B',
		lowerMm: 30,
		lowerInclusive: true,
		upperMm: 50,
		upperInclusive: true,
		range: '3 cm to 5 cm inclusive'
	},
	{
		grade: 'C',
		lowerMm: 50,
		lowerInclusive: false,
		upperMm: 70,
		upperInclusive: true,
		range: 'over 5 cm to 7 cm'
	},
	{
		grade: 'D',
		lowerMm: 70,
		lowerInclusive: false,
		upperMm: 90,
		upperInclusive: true,
		range: 'over 7 cm to 9 cm'
	}
];

/** Surgery is considered only from 5 cm (Carlstedt et al. 2020). */
export const SURGICAL_CONSIDERATION_MM = 50;

function inBand<Grade extends string>(band: SeverityBand<Grade>, widthMm: number): boolean {
	const aboveLower = band.lowerInclusive ? widthMm >= band.lowerMm : widthMm > band.lowerMm;
	if (!aboveLower) return false;
	if (band.upperMm === null) return true;
	return band.upperInclusive ? widthMm <= band.upperMm : widthMm < band.upperMm;
}

function findBand<Grade extends string>(
	bands: readonly SeverityBand<Grade>[],
	widthMm: number
): SeverityBand<Grade> | null {
	return bands.find((band) => inBand(band, widthMm)) ?? null;
}

export interface SeverityGrade {
	widthMm: number;
	reinpold: { grade: ReinpoldGrade; range: string; source: string };
	/** Null above 9 cm, where the scale ends. */
	keramidas: { grade: KeramidasGrade | null; range: string; source: string };
	notes: string[];
}

/**
 * Grade a measured width for the physiotherapist's view, or null when it is not diastasis
 * (20 mm or less; EHS 2021). Widths are measured mm, not finger-width estimates.
 */
export function gradeSeverity(widthMm: number): SeverityGrade | null {
	if (!Number.isFinite(widthMm) || widthMm < 0) {
		throw new RangeError('widthMm must be a finite number of millimetres, 0 or more');
	}
	if (!isPastCriterion(EHS_2021, widthMm, 'mm')) return null;

	const reinpold = findBand(REINPOLD_BANDS, widthMm);
	// The Reinpold bands cover every width past the EHS threshold; this only guards edits.
	if (reinpold === null) throw new Error(`No Reinpold band for ${widthMm} mm`);
	const keramidas = findBand(KERAMIDAS_BANDS, widthMm);

	const notes: string[] = [];
	if (widthMm >= SURGICAL_CONSIDERATION_MM) {
		notes.push(
			`At 5 cm or more, surgery may be considered — only after 6 months of structured training and 2 years or more after the last birth (${SOURCES.carlstedt2020}).`
		);
	}
	return {
		widthMm,
		reinpold: { grade: reinpold.grade, range: reinpold.range, source: SOURCES.reinpold2019 },
		keramidas: keramidas
			? { grade: keramidas.grade, range: keramidas.range, source: SOURCES.keramidas2022 }
			: { grade: null, range: 'over 9 cm, beyond the scale', source: SOURCES.keramidas2022 },
		notes
	};
}
