import { FINGER_WIDTH_STEP } from './sites';
import { SOURCES } from './sources';

/**
 * One finger width ≈ 15 mm (Rett et al. 2009; Pitangui et al.). An approximation: fingers
 * differ, so each examiner may set her own factor. Results are estimates and never feed a
 * millimetre criterion.
 */
export const DEFAULT_MM_PER_FINGER = 15;

export interface MmEstimate {
	mm: number;
	estimate: true;
	factor: number;
	source: string;
}

export interface FingersEstimate {
	fingers: number;
	/** Rounded to the test's own half step, for showing beside a screening. */
	fingersNearestHalf: number;
	estimate: true;
	factor: number;
	source: string;
}

function assertFactor(mmPerFinger: number): void {
	if (!Number.isFinite(mmPerFinger) || mmPerFinger <= 0) {
		throw new RangeError('mmPerFinger must be a positive number of millimetres');
	}
}

function assertNonNegative(value: number, name: string): void {
	if (!Number.isFinite(value) || value < 0) {
		throw new RangeError(`${name} must be a finite number, 0 or more`);
	}
}

function factorSource(mmPerFinger: number): string {
	return mmPerFinger === DEFAULT_MM_PER_FINGER
		? SOURCES.fingerWidthEstimate
		: `Examiner’s own factor of ${mmPerFinger} mm per finger width (approximate)`;
}

/** The millimetre figure alone, for a screen that states the factor and source once. */
export function fingersToMm(fingers: number, mmPerFinger: number = DEFAULT_MM_PER_FINGER): number {
	assertNonNegative(fingers, 'fingers');
	assertFactor(mmPerFinger);
	return fingers * mmPerFinger;
}

export function fingersToMmEstimate(
	fingers: number,
	mmPerFinger: number = DEFAULT_MM_PER_FINGER
): MmEstimate {
	return {
		mm: fingersToMm(fingers, mmPerFinger),
		estimate: true,
		factor: mmPerFinger,
		source: factorSource(mmPerFinger)
	};
}

export function mmToFingersEstimate(
	mm: number,
	mmPerFinger: number = DEFAULT_MM_PER_FINGER
): FingersEstimate {
	assertNonNegative(mm, 'mm');
	assertFactor(mmPerFinger);
	const fingers = mm / mmPerFinger;
	return {
		fingers,
		fingersNearestHalf: Math.round(fingers / FINGER_WIDTH_STEP) * FINGER_WIDTH_STEP,
		estimate: true,
		factor: mmPerFinger,
		source: factorSource(mmPerFinger)
	};
}
