import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { examinerFactor } from '../../src/lib/server/clients/service';
import { db } from '../../src/lib/server/db';
import { users } from '../../src/lib/server/db/schema';
import { ProblemError } from '../../src/lib/server/http/problem';
import { setFingerFactor } from '../../src/lib/server/people/service';
import { actions } from '../../src/routes/(app)/account/+page.server';
import { callerFor, makeOrganisation, makePerson } from './people-fixtures';

// Each examiner's millimetres per finger width: saved for herself, refused outside 5–40 mm,
// and read back by the client pages' mm estimates (with the default when she has set none).

type FactorEvent = Parameters<NonNullable<typeof actions.factor>>[0];

async function examiner() {
	const studio = await makeOrganisation('studio');
	const person = await makePerson([{ organisationId: studio, role: 'instructor' }]);
	return { userId: person.userId, caller: await callerFor(person.userId, studio) };
}

const stored = async (userId: string) =>
	(await db().select({ mm: users.mmPerFinger }).from(users).where(eq(users.id, userId)))[0]?.mm;

/** Posts the account page's factor form as she would, with `body` as its fields. */
async function postFactor(caller: Awaited<ReturnType<typeof examiner>>['caller'], body: string) {
	const url = new URL('http://127.0.0.1/account?/factor');
	const request = new Request(url, {
		method: 'POST',
		headers: { 'content-type': 'application/x-www-form-urlencoded' },
		body
	});
	return actions.factor!({
		url,
		request,
		locals: { actor: caller.actor, access: caller.access }
	} as unknown as FactorEvent);
}

describe('the finger-width factor', () => {
	it('uses the default until she sets her own, then hers', async () => {
		const { userId, caller } = await examiner();
		// Rett MT et al. 2009; Pitangui ACR et al. — one finger width ≈ 1.5 cm (the default)
		await expect(examinerFactor(caller)).resolves.toEqual({ mmPerFinger: 15, isDefault: true });
		await expect(setFingerFactor(caller, 17.5)).resolves.toBe(17.5);
		expect(await stored(userId)).toBe(17.5);
		await expect(examinerFactor(caller)).resolves.toEqual({ mmPerFinger: 17.5, isDefault: false });
		await expect(setFingerFactor(caller, null)).resolves.toBeNull();
		await expect(examinerFactor(caller)).resolves.toEqual({ mmPerFinger: 15, isDefault: true });
	});

	it('accepts 5 and 40 mm and refuses anything outside, keeping what was saved', async () => {
		const { userId, caller } = await examiner();
		await setFingerFactor(caller, 5);
		await setFingerFactor(caller, 40);
		expect(await stored(userId)).toBe(40);
		for (const wrong of [4.9, 40.1, 0, -15, Number.NaN, Number.POSITIVE_INFINITY]) {
			const refused = await setFingerFactor(caller, wrong).catch((e: unknown) => e);
			expect(refused, String(wrong)).toBeInstanceOf(ProblemError);
			expect((refused as ProblemError).slug).toBe('validation-failed');
			expect((refused as ProblemError).init.errors?.map((e) => e.pointer)).toEqual([
				'/mmPerFinger'
			]);
		}
		expect(await stored(userId)).toBe(40);
	});

	it('the database refuses a factor outside 5–40 mm whoever writes it', async () => {
		const { userId } = await examiner();
		await expect(
			db().update(users).set({ mmPerFinger: 41 }).where(eq(users.id, userId))
		).rejects.toThrow();
		expect(await stored(userId)).toBeNull();
	});

	it('the account form saves her factor, empties it back to the default, and refuses 4 mm', async () => {
		const { userId, caller } = await examiner();
		await expect(postFactor(caller, 'mmPerFinger=17%2C5')).resolves.toEqual({
			factorSaved: true,
			mmPerFinger: 17.5
		});
		expect(await stored(userId)).toBe(17.5);

		const tooNarrow = await postFactor(caller, 'mmPerFinger=4');
		expect(tooNarrow).toMatchObject({
			status: 400,
			data: { values: { mmPerFinger: '4' }, errors: { mmPerFinger: expect.any(String) } }
		});
		const notANumber = await postFactor(caller, 'mmPerFinger=wide');
		expect(notANumber).toMatchObject({ status: 400 });
		// A form without the field is not the page's form: refused, nothing changed.
		expect(await postFactor(caller, '')).toMatchObject({ status: 400 });
		expect(await stored(userId)).toBe(17.5);

		await expect(postFactor(caller, 'mmPerFinger=')).resolves.toEqual({
			factorSaved: true,
			mmPerFinger: null
		});
		expect(await stored(userId)).toBeNull();
	});
});
