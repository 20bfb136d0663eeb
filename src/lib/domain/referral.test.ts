import { describe, expect, it } from 'vitest';
import {
	actorsInto,
	findTransition,
	isFinalState,
	REFERRAL_STATES,
	TRANSITIONS,
	TRANSITION_TARGETS,
	transitionsFrom
} from './referral';

// The transition table is Seamwell's own product rule (issue text, DESIGN.md "Referral"):
// no outside source. Expected pairs are written out here by hand, not derived from the table.

describe('the referral transition table', () => {
	it('allows exactly these moves', () => {
		const pairs = TRANSITIONS.map((t) => `${t.from}→${t.to}:${t.by}`).sort();
		expect(pairs).toEqual(
			[
				'draft→sent:studio_instructor',
				'draft→withdrawn:studio_instructor',
				'sent→withdrawn:studio_instructor',
				'accepted→withdrawn:studio_instructor',
				'sent→accepted:clinic_physio',
				'sent→declined:clinic_physio',
				'accepted→assessed:assigned_physio',
				'assessed→closed:assigned_physio'
			].sort()
		);
	});

	it('refuses every other pair', () => {
		let refused = 0;
		for (const from of REFERRAL_STATES) {
			for (const to of REFERRAL_STATES) {
				if (findTransition(from, to) === null) refused++;
			}
		}
		expect(refused).toBe(7 * 7 - 8);
		expect(findTransition('declined', 'accepted')).toBeNull();
		expect(findTransition('closed', 'withdrawn')).toBeNull();
		expect(findTransition('assessed', 'withdrawn')).toBeNull();
	});

	it('needs a reason to withdraw and to decline, and none to send or accept', () => {
		expect(findTransition('draft', 'withdrawn')?.reasonRequired).toBe(true);
		expect(findTransition('accepted', 'withdrawn')?.reasonRequired).toBe(true);
		expect(findTransition('sent', 'declined')?.reasonRequired).toBe(true);
		expect(findTransition('draft', 'sent')?.reasonRequired).toBe(false);
		expect(findTransition('sent', 'accepted')?.reasonRequired).toBe(false);
	});

	it('needs consent with referral and screenings to send, and none to withdraw', () => {
		expect(findTransition('draft', 'sent')?.consent).toEqual(['referral', 'screenings']);
		expect(findTransition('sent', 'withdrawn')?.consent).toEqual([]);
		expect(findTransition('sent', 'accepted')?.consent).toEqual(['referral']);
	});

	it('knows who may lead into each state', () => {
		expect(actorsInto('withdrawn')).toEqual(['studio_instructor']);
		expect(actorsInto('accepted')).toEqual(['clinic_physio']);
		expect(actorsInto('closed')).toEqual(['assigned_physio']);
		expect(actorsInto('draft')).toEqual([]);
		expect(TRANSITION_TARGETS).not.toContain('draft');
	});

	it('lists the moves a role has from a state', () => {
		expect(transitionsFrom('sent', ['studio_instructor']).map((t) => t.to)).toEqual(['withdrawn']);
		expect(transitionsFrom('sent', ['clinic_physio']).map((t) => t.to)).toEqual([
			'accepted',
			'declined'
		]);
		expect(transitionsFrom('draft', ['clinic_physio'])).toEqual([]);
	});

	it('ends in declined, closed and withdrawn', () => {
		expect(REFERRAL_STATES.filter(isFinalState)).toEqual(['declined', 'closed', 'withdrawn']);
	});
});
