import { describe, expect, it } from 'vitest';
import { reasonForClient } from './client-words';
import { readableDays } from './words';

// The limits' reasons as the client reads them on her own record. The sentences are the
// templates of src/lib/domain/limits-rules.ts and limits-holds.ts with invented days.

const STUDIO_REASONS = [
	'Her screening on 2026-11-18 calls for a referral: loaded flexion and long-lever abdominal work wait until she has been assessed.',
	'See your doctor or midwife first: dizziness. Every movement waits until a clinician has cleared her, or a later screening records that she was seen and the sign has gone.',
	'Recorded on 2026-11-18: leaking. High-pressure effort and impact wait until a physiotherapist has assessed her.',
	'Her birth date is not recorded, so it is not known whether she is past 6 weeks: everything except deep stabilisation waits until it is.',
	'Four weeks after the birth, under 6 weeks: everything except deep stabilisation waits until her postnatal check.',
	'Her postnatal check is recorded as not done or not cleared: everything except deep stabilisation waits until it clears her.',
	'Her postnatal check is booked for 2026-12-10 and has not happened yet: everything except deep stabilisation waits until it clears her.',
	'Self-reported on 2026-11-20: heaviness. Loaded flexion and long-lever abdominal work wait until a physiotherapist has seen her.'
];

describe('reasonForClient', () => {
	it('speaks to her, never about her', () => {
		for (const reason of STUDIO_REASONS) {
			expect(reasonForClient(reason), reason).not.toMatch(/\b(she|her)\b/i);
		}
	});

	it('keeps the meaning and writes the days out', () => {
		expect(reasonForClient(STUDIO_REASONS[0]!)).toBe(
			'Your screening on 18 Nov 2026 calls for a referral: loaded flexion and long-lever abdominal work wait until you have been assessed.'
		);
		expect(reasonForClient(STUDIO_REASONS[1]!)).toContain(
			'until a clinician has cleared you, or a later screening records that you were seen'
		);
		expect(reasonForClient(STUDIO_REASONS[3]!)).toContain('whether you are past 6 weeks');
	});

	it('leaves the studio’s own wording to readableDays alone', () => {
		expect(readableDays(STUDIO_REASONS[0]!)).toMatch(/^Her screening on 18 Nov 2026 /);
	});
});
