import type { Browser, Page } from '@playwright/test';
import { randomUUID } from 'node:crypto';
import { expect, test } from './support/test';
import { expectAccessible } from './a11y';
import { seedSelfCareClient as seedClient } from './support/self-care';
import { signIn, sql } from './support/signin';

// Between classes on a phone: a client (invented by the spec, 20 weeks after a vaginal birth)
// does the whole self-check at 390 px — symptoms, where to feel, the curl-up, three places —
// gets her advice, shares with her studio, and marks a home practice done. Her instructor then
// sees the self-check marked self-reported.

async function personPage(browser: Browser, email: string, width: number): Promise<Page> {
	const context = await browser.newContext({ viewport: { width, height: 844 } });
	const page = await context.newPage();
	await signIn(page, email);
	return page;
}

test('the whole self-check on a 390 px phone, sharing, and marking a practice done', async ({
	browser
}) => {
	const email = `self-${randomUUID().slice(0, 8)}@client.example`;
	const name = `Rosa Test ${randomUUID().slice(0, 4)}`;
	const clientId = await seedClient(email, name);
	const page = await personPage(browser, email, 390);

	await page.goto('/check');
	await expect(page.getByRole('heading', { name: 'Check myself' })).toBeVisible();
	await expect(page.getByText(/How are you feeling\?/)).toBeVisible();
	await expectAccessible(page);
	await page.getByRole('button', { name: 'Next' }).click();

	await expect(page.getByRole('heading', { name: 'Where to feel' })).toBeVisible();
	await expect(page.getByRole('img', { name: /three places along the line/ })).toBeVisible();
	await expectAccessible(page);
	await page.getByRole('button', { name: 'Next' }).click();

	await expect(page.getByRole('heading', { name: 'How to curl up' })).toBeVisible();
	await expect(
		page.getByRole('img', { name: /Breathe out and lift only your head/ })
	).toBeVisible();
	await page.getByRole('button', { name: 'Next' }).click();

	await expect(page.getByRole('heading', { name: /Place 1 of 3/ })).toBeVisible();
	await page.getByLabel('How many fingers fit the gap?').selectOption({ label: '1 finger width' });
	await expectAccessible(page);
	await page.getByRole('button', { name: 'Next' }).click();
	await expect(page.getByRole('heading', { name: /Place 2 of 3/ })).toBeVisible();
	// Sperstad 2016: 2 finger widths at one place → worth showing her instructor
	await page.getByLabel('How many fingers fit the gap?').selectOption({ label: '2 finger widths' });
	await page.getByRole('button', { name: 'Next' }).click();
	await expect(page.getByRole('heading', { name: /Place 3 of 3/ })).toBeVisible();
	await page.getByRole('button', { name: 'Save and see advice' }).click();

	await expect(page.getByRole('heading', { name: 'Show your instructor' })).toBeVisible();
	await expect(page.getByTestId('advice-text')).toContainText(
		'Your instructor sees this later, not live'
	);
	await expectAccessible(page);
	const scroll = await page.evaluate(() => document.documentElement.scrollWidth);
	expect(scroll).toBeLessThanOrEqual(390);

	await expect(page.getByTestId('sharing-state')).toContainText('Off');
	await page.getByRole('button', { name: /Share with Linden Row Studio/ }).click();
	await expect(page.getByTestId('sharing-state')).toContainText('On');

	await page.goto('/practice');
	await expect(page.getByRole('heading', { name: 'Heel slides' })).toBeVisible();
	await expect(page.getByText('Stop if:').first()).toBeVisible();
	await expectAccessible(page);
	await page.getByRole('button', { name: 'Done, it felt fine' }).click();
	await expect(page.getByRole('status')).toContainText('Marked done');
	await expect(page.getByRole('listitem').filter({ hasText: '— felt fine' })).toHaveCount(1);
	await page.screenshot({ path: `/tmp/selfcheck-practice-390.png`, fullPage: true });

	const rows = (await sql<{ n: string }>(
		`select count(*)::text as n from home_practice_sessions where client_id = $1 and felt_ok`,
		[clientId]
	)) as Array<{ n: string }>;
	expect(rows[0]!.n).toBe('1');

	// A physiotherapist's clearance puts loaded flexion on hold: the curl-up shows paused at once.
	await expect(page.getByText('Paused — tell your instructor')).toHaveCount(0);
	const levels = {
		loaded_flexion: 'hold',
		long_lever: 'cleared',
		front_loaded: 'cleared',
		loaded_rotation: 'cleared',
		loaded_extension: 'cleared',
		inversion: 'cleared',
		high_pressure: 'cleared',
		impact: 'cleared',
		deep_stability: 'cleared'
	};
	await sql(
		`insert into clearances (client_id, clinic_id, levels, modifications, review_on, set_by,
			stage_at_set, known_until)
		 select $1, c.id, $2::jsonb, '{}'::jsonb, (now() + interval '6 weeks')::date, p.id,
			'postpartum', now()
		 from organisations c, users p
		 where c.name = 'Fernbank Pelvic Health' and p.email = 'physio@clinic.example'`,
		[clientId, JSON.stringify(levels)]
	);
	await page.goto('/practice');
	const curlUp = page.getByRole('listitem').filter({ hasText: 'Curl-up' });
	await expect(curlUp.getByText('Paused — tell your instructor')).toBeVisible();
	await expect(page.getByText('Paused — tell your instructor')).toHaveCount(1);
	await expectAccessible(page);

	const instructor = await personPage(browser, 'instructor@studio.example', 1280);
	await instructor.goto(`/clients/${clientId}`);
	await expect(instructor.getByRole('heading', { name: 'Between classes' })).toBeVisible();
	await expect(instructor.getByTestId('self-checks')).toContainText('She was asked to show you');
	await expect(instructor.getByTestId('adherence')).toContainText('1 practice marked done');
	await expect(instructor.getByText(/Needs a swap: Curl-up/)).toBeVisible();
	await instructor.screenshot({ path: `/tmp/selfcheck-instructor-1280.png`, fullPage: true });
});
