import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { clientCreateSchema, screeningInputSchema } from './schemas';

const site = { widthFingers: 1.5, depth: 'shallow', tension: 'firm', doming: false };
const valid = {
	takenAt: '2025-01-15T10:00:00Z',
	sites: { above_navel: site, at_navel: site, below_navel: site },
	redFlags: ['leakage']
};

function pointers(result: ReturnType<typeof screeningInputSchema.safeParse>): string[] {
	return result.success ? [] : result.error.issues.map((i) => i.path.join('/'));
}

describe('screeningInputSchema', () => {
	it('accepts a whole screening', () => {
		const result = screeningInputSchema.safeParse(valid);
		expect(result.success).toBe(true);
	});

	it.each([6.5, -0.5, 1.25, 2.1])('refuses %s finger widths (0 to 6 in half steps)', (width) => {
		// common practice, no source — the finger-width test reads 0 to 6 in half steps
		const result = screeningInputSchema.safeParse({
			...valid,
			sites: { ...valid.sites, at_navel: { ...site, widthFingers: width } }
		});
		expect(pointers(result)).toEqual(['sites/at_navel/widthFingers']);
	});

	it('accepts 0 and 6 finger widths, the ends of the scale', () => {
		// common practice, no source
		for (const width of [0, 6]) {
			const result = screeningInputSchema.safeParse({
				...valid,
				sites: { ...valid.sites, above_navel: { ...site, widthFingers: width } }
			});
			expect(result.success).toBe(true);
		}
	});

	it('names text in a number field, a missing site, an unknown site and an unknown flag', () => {
		const result = screeningInputSchema.safeParse({
			...valid,
			sites: {
				above_navel: { ...site, widthFingers: 'two' },
				at_navel: site,
				navel_top: site
			},
			redFlags: ['leakage', 'sore_toe']
		});
		expect(pointers(result).sort()).toEqual(
			[
				'redFlags/1',
				'sites/above_navel/widthFingers',
				'sites/below_navel',
				'sites/navel_top'
			].sort()
		);
	});

	it('refuses a screening dated tomorrow-but-one and a timestamp an hour ahead', () => {
		const inTwoDays = new Date(Date.now() + 2 * 86_400_000).toISOString().slice(0, 10);
		const inAnHour = new Date(Date.now() + 3_600_000).toISOString();
		for (const takenAt of [inTwoDays, inAnHour]) {
			expect(pointers(screeningInputSchema.safeParse({ ...valid, takenAt }))).toEqual(['takenAt']);
		}
	});

	it('reads a day alone as noon UTC, or now when today', () => {
		const past = screeningInputSchema.parse({ ...valid, takenAt: '2025-01-15' });
		expect(past.takenAt.toISOString()).toBe('2025-01-15T12:00:00.000Z');
		const today = new Date().toISOString().slice(0, 10);
		const now = screeningInputSchema.parse({ ...valid, takenAt: today });
		expect(now.takenAt.getTime()).toBeLessThanOrEqual(Date.now());
	});

	it('refuses NUL characters in notes', () => {
		expect(pointers(screeningInputSchema.safeParse({ ...valid, notes: 'a\u0000b' }))).toEqual([
			'notes'
		]);
	});

	it('drops repeated flags', () => {
		const parsed = screeningInputSchema.parse({ ...valid, redFlags: ['leakage', 'leakage'] });
		expect(parsed.redFlags).toEqual(['leakage']);
	});
});

describe('clientCreateSchema', () => {
	const postpartum = {
		name: 'Test Person',
		stage: 'postpartum',
		birthDate: '2025-01-01',
		delivery: 'vaginal',
		births: 1,
		multiples: false
	};

	it('accepts a postpartum client with consent', () => {
		const parsed = clientCreateSchema.parse({
			...postpartum,
			email: ' Test@Example.COM ',
			intakeConsent: { at: '2025-02-01', method: 'in_person' }
		});
		expect(parsed.email).toBe('test@example.com');
		expect(parsed.intakeConsent?.method).toBe('in_person');
	});

	it('refuses a birth date after today, even with the day of grace', () => {
		const inTwoDays = new Date(Date.now() + 2 * 86_400_000).toISOString().slice(0, 10);
		const result = clientCreateSchema.safeParse({ ...postpartum, birthDate: inTwoDays });
		expect(result.success).toBe(false);
		expect(result.error?.issues.map((i) => i.path.join('/'))).toEqual(['birthDate']);
	});

	describe('just after midnight in a zone ahead of UTC', () => {
		// 23:30 UTC on 9 March is 00:30 on 10 March in Berlin (UTC+1): her today is 10 March.
		beforeEach(() => {
			vi.useFakeTimers();
			vi.setSystemTime(new Date('2025-03-09T23:30:00Z'));
		});
		afterEach(() => vi.useRealTimers());

		it('accepts her today as the birth date and the postnatal check date', () => {
			const result = clientCreateSchema.safeParse({
				...postpartum,
				birthDate: '2025-03-10',
				postnatalCheckOn: '2025-03-10'
			});
			expect(result.success).toBe(true);
		});

		it('still refuses the day after her today', () => {
			const result = clientCreateSchema.safeParse({
				...postpartum,
				birthDate: '2025-03-10',
				postnatalCheckOn: '2025-03-11'
			});
			expect(result.error?.issues.map((i) => i.path.join('/'))).toEqual(['postnatalCheckOn']);
		});
	});

	it('needs a due date in pregnancy and the birth details after it', () => {
		const pregnant = clientCreateSchema.safeParse({ name: 'A', stage: 'pregnant' });
		expect(pregnant.error?.issues.map((i) => i.path.join('/'))).toEqual(['dueDate']);
		const after = clientCreateSchema.safeParse({ name: 'A', stage: 'postpartum' });
		expect(after.error?.issues.map((i) => i.path.join('/')).sort()).toEqual(
			['birthDate', 'births', 'delivery', 'multiples'].sort()
		);
	});

	it('refuses an unknown stage and an unknown consent method', () => {
		expect(clientCreateSchema.safeParse({ name: 'A', stage: 'trimester' }).success).toBe(false);
		const result = clientCreateSchema.safeParse({
			...postpartum,
			intakeConsent: { at: '2025-02-01', method: 'telepathy' }
		});
		expect(result.error?.issues.map((i) => i.path.join('/'))).toEqual(['intakeConsent/method']);
	});

	it('refuses a postnatal check before the birth', () => {
		const result = clientCreateSchema.safeParse({ ...postpartum, postnatalCheckOn: '2024-12-01' });
		expect(result.error?.issues.map((i) => i.path.join('/'))).toEqual(['postnatalCheckOn']);
	});
});
