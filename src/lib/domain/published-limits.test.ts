import { describe, expect, it } from 'vitest';
import { BEER_XIPHOID } from './criteria';
import { compareWithPublishedLimits, positionLabel, type MeasuredWidth } from './published-limits';

function ids(measure: MeasuredWidth): string[] {
	return compareWithPublishedLimits(measure).matches.map((match) => match.criterion.id);
}

function match(measure: MeasuredWidth, id: string) {
	const found = compareWithPublishedLimits(measure).matches.find((m) => m.criterion.id === id);
	if (!found) throw new Error(`${id} did not match`);
	return found;
}

const ABOVE_3CM = { site: 'above_navel', distanceCm: 3 } as const;
const BELOW_2CM = { site: 'below_navel', distanceCm: 2 } as const;

describe('compareWithPublishedLimits — matching site and method', () => {
	it('matches ultrasound 3 cm above with Beer, Qu and the general EHS definition only', () => {
		// Beer GM et al. 2009; Qu E et al. (2021); Hernández-Granados P et al. 2021 — their own sites
		expect(ids({ position: ABOVE_3CM, method: 'ultrasound', widthMm: 23 })).toEqual([
			'beer-2009-above-3cm',
			'ehs-2021',
			'qu-2021-above-3cm'
		]);
	});

	it('treats Beer’s 22 mm as the inclusive upper limit of normal', () => {
		// Beer GM et al. 2009 — "up to 22 mm" 3 cm above is normal (90th percentile)
		const at22 = match(
			{ position: ABOVE_3CM, method: 'ultrasound', widthMm: 22 },
			'beer-2009-above-3cm'
		);
		expect(at22.exceeded).toBe(false);
		expect(at22.detail).toContain('within the normal limit of 22 mm');
		const at23 = match(
			{ position: ABOVE_3CM, method: 'ultrasound', widthMm: 23 },
			'beer-2009-above-3cm'
		);
		expect(at23.exceeded).toBe(true);
		expect(at23.source).toContain('Beer GM');
	});

	it('judges 15 mm at the xiphoid normal and 15.5 mm wider', () => {
		// Beer GM et al. 2009 — up to 15 mm at the xiphoid
		const position = { site: 'xiphoid' } as const;
		expect(
			match({ position, method: 'ultrasound', widthMm: 15 }, 'beer-2009-xiphoid').exceeded
		).toBe(false);
		expect(
			match({ position, method: 'ultrasound', widthMm: 15.5 }, 'beer-2009-xiphoid').exceeded
		).toBe(true);
	});

	it('flags exactly 16 mm 2 cm below as the unclear Mota boundary', () => {
		// Mota P et al. 2015 — IRD > 16 mm 2 cm below; whether exactly 16 mm counts is unclear
		const at16 = match(
			{ position: BELOW_2CM, method: 'ultrasound', widthMm: 16 },
			'mota-2015-below-2cm'
		);
		expect(at16).toMatchObject({ exceeded: false, boundaryUnclear: true });
		expect(at16.detail).toContain('does not say whether this counts');
		const past = match(
			{ position: BELOW_2CM, method: 'ultrasound', widthMm: 16.5 },
			'mota-2015-below-2cm'
		);
		expect(past).toMatchObject({ exceeded: true, boundaryUnclear: false });
	});

	it('does not flag Beer’s 16 mm as unclear: “up to” is inclusive', () => {
		// Beer GM et al. 2009 — up to 16 mm 2 cm below is normal
		const beer = match(
			{ position: BELOW_2CM, method: 'ultrasound', widthMm: 16 },
			'beer-2009-below-2cm'
		);
		expect(beer).toMatchObject({ exceeded: false, boundaryUnclear: false });
	});

	it('judges 20 mm at the navel within Qu and EHS, and 21 mm past both', () => {
		// Qu E et al. (2021) — > 20 mm at the navel; Hernández-Granados P et al. 2021 — > 2 cm
		const position = { site: 'at_navel' } as const;
		const at20 = compareWithPublishedLimits({ position, method: 'ultrasound', widthMm: 20 });
		expect(at20.matches.map((m) => [m.criterion.id, m.exceeded])).toEqual([
			['ehs-2021', false],
			['qu-2021-at-navel', false]
		]);
		const at21 = compareWithPublishedLimits({ position, method: 'ultrasound', widthMm: 21 });
		expect(at21.matches.every((m) => m.exceeded)).toBe(true);
	});

	it('matches the Qu criterion 3 cm below, as given', () => {
		// Qu E et al. (2021) — > 2 mm 3 cm below, as given in REFERENCES.md
		const position = { site: 'below_navel', distanceCm: 3 } as const;
		expect(
			match({ position, method: 'ultrasound', widthMm: 3 }, 'qu-2021-below-3cm').exceeded
		).toBe(true);
	});

	it('leaves ultrasound-only criteria out for a caliper width', () => {
		// REFERENCES.md — compare a measurement only with a criterion of matching method
		const result = compareWithPublishedLimits({
			position: ABOVE_3CM,
			method: 'caliper',
			widthMm: 23
		});
		expect(result.matches.map((m) => m.criterion.id)).toEqual(['ehs-2021']);
		expect(result.noSiteSpecificCriterion).toBe(true);
		expect(result.detail).toContain('No matching site-specific criterion');
		expect(result.detail).toContain('by calipers');
	});
});

describe('compareWithPublishedLimits — sites without a criterion', () => {
	it.each(['above_navel', 'below_navel'] as const)(
		'finds no site-specific criterion 4.5 cm %s (the screening sites)',
		(site) => {
			// Sperstad JB et al. 2016 — screening sites 4.5 cm from the navel; Beer/Mota/Qu use 2–3 cm
			const result = compareWithPublishedLimits({
				position: { site, distanceCm: 4.5 },
				method: 'ultrasound',
				widthMm: 25
			});
			expect(result.matches.map((m) => m.criterion.id)).toEqual(['ehs-2021']);
			expect(result.noSiteSpecificCriterion).toBe(true);
			expect(result.detail).toContain('No matching site-specific criterion');
			expect(result.detail).toContain('4.5 cm');
		}
	);

	it('says “no published criterion” when nothing at all matches', () => {
		const result = compareWithPublishedLimits(
			{ position: { site: 'at_navel' }, method: 'ultrasound', widthMm: 30 },
			[BEER_XIPHOID]
		);
		expect(result.matches).toEqual([]);
		expect(result.noSiteSpecificCriterion).toBe(true);
		expect(result.detail).toContain('No published criterion matches');
	});

	it('never matches a criterion whose site is not stated', () => {
		// Hills NF et al. 2018 — site not in our references
		const positions = [
			{ site: 'xiphoid' },
			{ site: 'at_navel' },
			ABOVE_3CM,
			BELOW_2CM,
			{ site: 'below_navel', distanceCm: 3 }
		] as const;
		for (const position of positions) {
			expect(ids({ position, method: 'ultrasound', widthMm: 30 })).not.toContain(
				'hills-2018-one-year'
			);
		}
	});

	it('never matches the finger-width rule', () => {
		// Bursch SG 1987 — finger widths never meet a mm criterion
		expect(ids({ position: { site: 'at_navel' }, method: 'caliper', widthMm: 40 })).not.toContain(
			'sperstad-2016-finger-width'
		);
	});
});

describe('compareWithPublishedLimits — input checks', () => {
	it('refuses palpation at run time too', () => {
		// Benjamin DR et al. — finger width agrees with ultrasound only within 18 mm
		const palpated = { position: { site: 'at_navel' }, method: 'palpation', widthMm: 30 } as const;
		// @ts-expect-error finger-width estimates are refused by type
		expect(() => compareWithPublishedLimits(palpated)).toThrow(TypeError);
	});

	it('refuses a negative width and a zero distance', () => {
		expect(() =>
			compareWithPublishedLimits({ position: { site: 'at_navel' }, method: 'caliper', widthMm: -1 })
		).toThrow(RangeError);
		expect(() =>
			compareWithPublishedLimits({
				position: { site: 'above_navel', distanceCm: 0 },
				method: 'caliper',
				widthMm: 10
			})
		).toThrow(RangeError);
	});
});

describe('positionLabel', () => {
	it('names each kind of position', () => {
		expect(positionLabel({ site: 'xiphoid' })).toBe('at the xiphoid');
		expect(positionLabel({ site: 'at_navel' })).toBe('at the navel');
		expect(positionLabel({ site: 'below_navel', distanceCm: 2 })).toBe('2 cm below the navel');
	});
});
