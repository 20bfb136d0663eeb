import type { Browser, Page } from '@playwright/test';
import { randomUUID } from 'node:crypto';
import { expect, test } from './support/test';
import { expectAccessible } from './a11y';
import { signIn, sql } from './support/signin';

// The plan loop: a physiotherapist's clearance holds loaded flexion for one client (set in the
// database here: the clearance screens have their own spec); the instructor starts a class plan,
// adds a curl-up from the library, reorders by keyboard, sees the curl-up blocked for that
// client with an alternative and ok for a client without limits, swaps it for her only, and
// opens the class sheet in print preview. Clients and clearance are invented by the spec.

const INSTRUCTOR = 'instructor@studio.example';
const PHYSIO = 'physio@clinic.example';

async function personPage(browser: Browser, email: string, width = 1280): Promise<Page> {
	const context = await browser.newContext({ viewport: { width, height: 900 } });
	const page = await context.newPage();
	await signIn(page, email);
	return page;
}

async function seedClient(name: string): Promise<string> {
	const [row] = (await sql<{ id: string }>(
		`insert into clients (organisation_id, name, stage, birth_date, delivery, postnatal_check_on,
			postnatal_cleared, intake_consent_at, intake_consent_method)
		 select id, $1, 'postpartum', (now() - interval '30 weeks')::date, 'vaginal',
			(now() - interval '24 weeks')::date, true, now() - interval '20 weeks', 'in_person'
		 from organisations where name = 'Linden Row Studio' returning id`,
		[name]
	)) as Array<{ id: string }>;
	return row!.id;
}

async function holdLoadedFlexion(clientId: string): Promise<void> {
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
		 where c.name = 'Fernbank Pelvic Health' and p.email = $3`,
		[clientId, JSON.stringify(levels), PHYSIO]
	);
}

test('a clinician’s hold blocks the curl-up for one client; swap for her only; class sheet', async ({
	browser
}) => {
	test.setTimeout(180_000);
	const tag = randomUUID().slice(0, 6);
	const heldName = `Tamsin${tag} Vale`;
	const freeName = `Orla${tag} Finch`;
	const held = await seedClient(heldName);
	await seedClient(freeName);
	await holdLoadedFlexion(held);

	const page = await personPage(browser, INSTRUCTOR);
	await page.goto('/plans');
	await expect(page.getByRole('heading', { name: 'Session plans' })).toBeVisible();
	await expect(page.getByRole('complementary', { name: 'Caution' })).toBeVisible();
	await expectAccessible(page);

	// Start a class plan for both clients.
	await page.getByLabel('Title').fill(`Thursday mat ${tag}`);
	await page.getByLabel(heldName).check();
	await page.getByLabel(freeName).check();
	await page.getByRole('button', { name: 'Start plan' }).click();
	await expect(page.getByRole('heading', { name: `Thursday mat ${tag}` })).toBeVisible();

	// Add a curl-up, then heel slides, from the library by search.
	await page.getByLabel('Search').fill('curl-up (head');
	await page.getByRole('button', { name: 'Add Curl-up (head and shoulder lift)' }).click();
	await expect(page.getByRole('rowheader', { name: /1\. Curl-up/ })).toBeVisible();
	await page.getByLabel('Search').fill('heel slides');
	await page.getByRole('button', { name: 'Add Heel slides' }).click();
	await expect(page.getByRole('rowheader', { name: /2\. Heel slides/ })).toBeVisible();

	// Keyboard-only reorder: focus "move up" on heel slides and press Enter (once the save and
	// the fresh check have finished, the button is enabled again).
	const moveUp = page.getByRole('button', { name: 'Move Heel slides up' });
	await expect(moveUp).toBeEnabled();
	await moveUp.focus();
	await page.keyboard.press('Enter');
	await expect(page.getByRole('rowheader', { name: /1\. Heel slides/ })).toBeVisible();
	await expect(page.getByRole('rowheader', { name: /2\. Curl-up/ })).toBeVisible();

	// The curl-up is blocked for Tamsin (the clinician's hold) and ok for Orla.
	const heldCell = page.getByTestId(`cell-1-Tamsin${tag}`);
	const freeCell = page.getByTestId(`cell-1-Orla${tag}`);
	await expect(heldCell).toContainText('Blocked');
	await expect(heldCell).toContainText('Loaded spinal flexion on hold');
	await expect(heldCell).toContainText('clinician’s clearance');
	await expect(heldCell).toContainText('Alternative: Back-lying breath with deep-core engagement');
	await expect(freeCell).toContainText('OK');
	await expect(freeCell).toContainText(/no clinician’s decision yet/i);
	// A clinician's block: no override offered, only swap, remove or ask for a review.
	await expect(page.getByLabel('Reason for the override')).toHaveCount(0);
	await expect(
		page.getByRole('button', { name: /Ask Tamsin.*physiotherapist to review/ })
	).toBeVisible();
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/plan-editor-1280.png', fullPage: true });

	// Swap for her only: Orla keeps the curl-up.
	await heldCell.getByRole('button', { name: `Swap for Tamsin${tag}` }).click();
	await expect(heldCell).toContainText('Instead: Back-lying breath with deep-core engagement');
	await expect(heldCell).toContainText('OK');
	await expect(freeCell).not.toContainText('Instead');
	await expect(page.getByRole('button', { name: 'Mark ready' })).toBeEnabled();
	await page.getByRole('button', { name: 'Mark ready' }).click();
	await expect(page.getByText('Ready', { exact: true })).toBeVisible();

	// The same editor at 390 px.
	const narrow = await personPage(browser, INSTRUCTOR, 390);
	await narrow.goto(page.url());
	await expect(narrow.getByTestId(`cell-1-Tamsin${tag}`)).toContainText('Instead');
	await narrow.screenshot({ path: 'test-results/plan-editor-390.png', fullPage: true });

	// Class sheet: first names, the swap, no reasons; print preview hides the site's header.
	await page.getByRole('link', { name: 'Class sheet' }).click();
	await expect(page.getByRole('heading', { name: `Thursday mat ${tag}` })).toBeVisible();
	await expectAccessible(page);
	const sheet = page.locator('article.class-sheet');
	await expect(sheet).toContainText(
		`Tamsin${tag}: instead Back-lying breath with deep-core engagement`
	);
	await expect(sheet).not.toContainText('Vale');
	await expect(sheet).not.toContainText('on hold');
	await expect(sheet.getByRole('complementary', { name: 'Caution' })).toBeVisible();
	await page.evaluate(() => {
		window.print = () => {};
	});
	const logged = page.waitForResponse((r) => r.url().endsWith('/print') && r.status() === 200);
	await page.getByRole('button', { name: 'Print the class sheet' }).click();
	await logged;
	await page.emulateMedia({ media: 'print' });
	await expect(page.getByRole('button', { name: 'Print the class sheet' })).toBeHidden();
	await expect(page.getByRole('navigation', { name: 'Main' })).toBeHidden();
	await page.screenshot({ path: 'test-results/plan-sheet-print.png', fullPage: true });
	const [row] = (await sql<{ n: number }>(
		`select count(*)::int as n from access_log where action = 'plan.printed'
			and target_id = $1`,
		[page.url().split('/plans/')[1]!.split('/')[0]!]
	)) as Array<{ n: number }>;
	expect(row!.n).toBe(2);
});
