import type { Browser, Page } from '@playwright/test';
import { randomUUID } from 'node:crypto';
import { expect, test, waitingForHydration } from './support/test';
import { expectAccessible } from './a11y';
import { seedLindenRowClient } from './support/self-care';
import { signIn, sql } from './support/signin';

// The clearance loop: the physiotherapist records an assessment on an accepted referral and
// sets a clearance (loaded flexion on hold, front-loaded work modified); the instructor sees
// the clearance card on the client page; the client reads it in plain words on her record.
// The spec makes its own client (invented), consent and accepted referral.

const INSTRUCTOR = 'instructor@studio.example';
const PHYSIO = 'physio@clinic.example';

async function personPage(browser: Browser, email: string, width = 1280): Promise<Page> {
	const context = await browser.newContext({ viewport: { width, height: 900 } });
	const page = await context.newPage();
	await signIn(page, email);
	// Like the fixture's page: goto returns once the page has hydrated.
	return waitingForHydration(page);
}

async function seedCase(email: string, name: string) {
	const { userId, clientId } = await seedLindenRowClient(email, name);
	await sql(
		`insert into consents (client_id, studio_id, clinic_id, scopes, starts_at, given_by)
		 select $1, s.id, c.id, array['referral','screenings','clearance','documents'],
			now() - interval '2 days', $2
		 from organisations s, organisations c
		 where s.name = 'Linden Row Studio' and c.name = 'Fernbank Pelvic Health'`,
		[clientId, userId]
	);
	const [referral] = (await sql<{ id: string }>(
		`insert into referrals (client_id, studio_id, clinic_id, physio_id, created_by, reason,
			urgency, red_flags, state, sent_at)
		 select $1, s.id, c.id, p.id, i.id, 'Gap of three finger widths at the navel (invented).',
			'routine', '{}', 'accepted', now() - interval '1 day'
		 from organisations s, organisations c, users p, users i
		 where s.name = 'Linden Row Studio' and c.name = 'Fernbank Pelvic Health'
			and p.email = $2 and i.email = $3 returning id`,
		[clientId, PHYSIO, INSTRUCTOR]
	)) as Array<{ id: string }>;
	return { clientId, referralId: referral!.id };
}

test('physio assesses and clears; the instructor sees the card; the client reads it plainly', async ({
	browser
}) => {
	test.setTimeout(180_000);
	const tag = randomUUID().slice(0, 8);
	const email = `clr-${tag}@client.example`;
	const name = `Wren Talbot ${tag}`;
	const { clientId, referralId } = await seedCase(email, name);

	// 1. The physiotherapist records her assessment.
	const physio = await personPage(browser, PHYSIO);
	await physio.goto(`/referrals/${referralId}`);
	await expect(physio.getByRole('heading', { name: 'Record the assessment' })).toBeVisible();
	const first = physio.getByRole('group', { name: 'Point 1' });
	await physio.getByLabel('Plan').fill('Deep-core retraining; progress load as written.');
	await first.getByLabel('Curl-up (mm)').fill('19');
	// A width outside 0–150 mm comes back inline; nothing is saved.
	await first.getByLabel('At rest (mm)').fill('151');
	await physio.getByRole('button', { name: 'Save assessment' }).click();
	await expect(physio.locator('#p0-rest-error')).toContainText('0–150 mm');
	await expect(physio.locator('[data-state="accepted"]')).toBeVisible();
	await first.getByLabel('At rest (mm)').fill('24');
	await physio.getByRole('button', { name: 'Save assessment' }).click();
	await expect(physio.getByText('Assessment saved; the referral is assessed.')).toBeVisible();
	await expect(physio.locator('[data-state="assessed"]')).toBeVisible();
	// Each comparison names its source.
	await expect(physio.getByText(/Source:/).first()).toBeVisible();

	// 2. …and sets the clearance: every category one tap, a modification for `modify`.
	await expect(physio.getByText('write the movement change, not the diagnosis')).toBeVisible();
	for (const label of [
		'Long-lever abdominal load',
		'Loaded rotation',
		'Loaded extension that stretches the abdominal wall',
		'Inversion and rolling',
		'High-pressure effort (heavy lifting, breath holding)',
		'Impact',
		'Deep stabilisation'
	]) {
		await physio
			.getByRole('group', { name: label, exact: true })
			.getByRole('radio', { name: 'Cleared', exact: true })
			.check();
	}
	await physio
		.getByRole('group', { name: 'Loaded spinal flexion' })
		.getByRole('radio', { name: 'Hold', exact: true })
		.check();
	const front = physio.getByRole('group', {
		name: 'Front-loaded plank and four-point weight bearing'
	});
	await front.getByRole('radio', { name: 'Modify', exact: true }).check();
	await physio
		.getByLabel('Review on')
		.fill(new Date(Date.now() + 42 * 86_400_000).toISOString().slice(0, 10));
	// `modify` without its text is refused inline, nothing saved.
	await physio.getByRole('button', { name: 'Save clearance' }).click();
	await expect(physio.locator('#mod-front_loaded-error')).toContainText('write the modification');
	await front.getByLabel('How to modify it').fill('Plank from the knees; five slow breaths.');
	await expectAccessible(physio);
	await physio.getByRole('button', { name: 'Save clearance' }).click();
	await expect(physio.getByText('Clearance saved. The studio sees it now.')).toBeVisible();
	await physio.screenshot({ path: 'test-results/clearance-physio-1280.png', fullPage: true });
	await physio.setViewportSize({ width: 390, height: 844 });
	await physio.screenshot({ path: 'test-results/clearance-physio-390.png', fullPage: true });

	// 3. The instructor sees the card on the client page.
	const instructor = await personPage(browser, INSTRUCTOR);
	await instructor.goto(`/clients/${clientId}`);
	const card = instructor.getByRole('region', { name: 'Movement clearance' });
	await expect(card).toContainText('Set by Dr Ilse Marchetti, Fernbank Pelvic Health');
	await expect(card).toContainText('Plank from the knees; five slow breaths.');
	await expect(
		card.getByRole('listitem').filter({ hasText: 'Loaded spinal flexion' })
	).toContainText('Not yet');
	await expect(card.getByRole('listitem').filter({ hasText: 'Front-loaded plank' })).toContainText(
		'Cleared with a change'
	);
	await expect(card).toContainText('Clearances are set by the treating clinician');
	await expectAccessible(instructor);
	await instructor.screenshot({
		path: 'test-results/clearance-instructor-1280.png',
		fullPage: true
	});
	await instructor.goto(`/clients?search=${encodeURIComponent(name)}`);
	await expect(instructor.getByRole('row', { name: new RegExp(name) })).toContainText(
		'Cleared with changes'
	);
	await expectAccessible(instructor);

	// 4. The client reads it in plain words.
	const client = await personPage(browser, email, 390);
	await client.goto('/my-record');
	const mine = client.getByRole('region', { name: 'What my physiotherapist cleared' });
	await expect(mine).toContainText('Planks, and work on hands and knees');
	await expect(
		mine.getByRole('listitem').filter({ hasText: 'Planks, and work on hands and knees' })
	).toContainText('You can do this, changed like this');
	await expect(
		mine.getByRole('listitem').filter({ hasText: 'Curling up against resistance' })
	).toContainText('Not yet');
	await expectAccessible(client);
	await client.screenshot({ path: 'test-results/clearance-client-390.png', fullPage: true });
});

test('an assessment after a screening that said refer takes over from it; each reads in its own words', async ({
	browser
}) => {
	// Demo (src/lib/server/demo/clearances.ts): Freya Castellan's latest screening said refer,
	// and Dr Ilse Marchetti set her clearance two weeks after it.
	const instructor = await personPage(browser, INSTRUCTOR, 390);
	await instructor.goto('/clients?search=Freya');
	await instructor.getByRole('link', { name: 'Freya Castellan' }).first().click();
	const since = instructor.getByRole('region', { name: 'Assessed since her latest screening' });
	await expect(since).toContainText('set her clearance on');
	await expect(instructor.getByRole('button', { name: 'Open a referral' })).toHaveCount(0);
	await expect(since.getByRole('button', { name: 'Refer her again' })).toBeVisible();
	// Who set the clearance and when is said once, not again under every movement.
	const card = instructor.getByRole('region', { name: 'Movement clearance' });
	await expect(card).toContainText('Set by Dr Ilse Marchetti');
	await expect(card.getByText(/Cleared by Dr Ilse Marchetti/)).toHaveCount(0);
	await expectAccessible(instructor);

	// Bea Sorensen (client2) has no clearance: her studio's cautions are addressed to her, with
	// the day written out.
	const client = await personPage(browser, 'client2@client.example', 390);
	await client.goto('/my-record');
	const caution = client.getByRole('region', {
		name: 'Your studio’s caution until a physiotherapist has seen you'
	});
	await expect(caution).toContainText(/Your screening on \d{1,2} [A-Z][a-z]{2} \d{4} calls/);
	await expect(caution).not.toContainText(/\b(she|her)\b|\d{4}-\d{2}-\d{2}/);
});
