import { randomUUID } from 'node:crypto';
import { expect, test } from './support/test';
import { expectAccessible } from './a11y';
import { signIn, sql } from './support/signin';

// A client asks her studio to erase her data from her Privacy page; the studio's admin finds
// the request on her dashboard, reads what goes and what stays, and approves it; the client's
// session is gone. Each run erases a client of its own (the demo's people stay for the other
// suites), at a phone's and a desktop's width, with axe on every screen.

async function newClient(label: string): Promise<{ email: string; name: string }> {
	const tag = randomUUID().slice(0, 8);
	const email = `erase-${label}-${tag}@client.example`;
	const name = `Elin Marsh ${tag}`;
	await sql(
		`with studio as (select id from organisations where name = 'Linden Row Studio'),
		     person as (insert into users (email, name) values ($1, $2) returning id)
		 insert into clients (organisation_id, user_id, name, email, stage, birth_date, delivery,
		     births, multiples, intake_consent_at, intake_consent_method)
		 select studio.id, person.id, $2, $1, 'postpartum', '2026-06-02', 'vaginal', 1, false,
		     now(), 'in_person'
		 from studio, person`,
		[email, name]
	);
	return { email, name };
}

for (const [label, width, height] of [
	['desktop', 1280, 900],
	['phone', 390, 844]
] as const) {
	test(`a client asks to erase her data and the studio admin approves (${label})`, async ({
		page,
		browser
	}) => {
		test.setTimeout(180_000);
		await page.setViewportSize({ width, height });
		const client = await newClient(label);

		await signIn(page, client.email);
		await page.goto('/privacy');
		const section = page.getByTestId('erasure');
		await expect(section.getByRole('heading', { name: 'Ask to erase your data' })).toBeVisible();
		await expect(section).toContainText('What is kept, and why');
		// Asking without ticking the box explains itself and asks nothing.
		await section.getByRole('button', { name: 'Ask my studio to erase my data' }).click();
		await expect(section.getByRole('alert')).toContainText('Tick the box');
		await section.getByRole('checkbox').check();
		await section.getByRole('button', { name: 'Ask my studio to erase my data' }).click();
		await expect(section.getByRole('status')).toContainText('must answer by');
		await expectAccessible(page);
		await page.screenshot({ path: `test-results/erasure-asked-${label}.png`, fullPage: true });

		const adminContext = await browser.newContext({ viewport: { width, height } });
		const admin = await adminContext.newPage();
		await signIn(admin, 'admin@studio.example');
		await admin.goto('/admin');
		await admin.getByRole('link', { name: 'Open data requests' }).click();
		await expect(admin.getByRole('heading', { level: 1, name: 'Data requests' })).toBeVisible();
		const row = admin.getByTestId('open-request').filter({ hasText: client.name });
		await expect(row).toContainText('days left');
		await expectAccessible(admin);
		await row.getByRole('link', { name: 'Review and answer' }).click();
		await expect(admin.getByRole('heading', { level: 1 })).toContainText(client.name);
		await expect(admin.getByRole('heading', { name: 'What approving erases' })).toBeVisible();
		await expectAccessible(admin);
		await admin.screenshot({ path: `test-results/erasure-review-${label}.png`, fullPage: true });
		await admin.getByRole('checkbox', { name: /cannot be undone/ }).check();
		await admin.getByRole('button', { name: 'Erase her data' }).click();
		await expect(admin.getByRole('status')).toContainText('Erased on');
		await expect(admin.getByRole('heading', { level: 1 })).not.toContainText(client.name);
		await expectAccessible(admin);
		await admin.screenshot({ path: `test-results/erasure-done-${label}.png`, fullPage: true });
		await adminContext.close();

		// Her session ended with her account: the page sends her to sign in.
		await page.goto('/privacy');
		await expect(page).toHaveURL(/\/signin/);
		const left = await sql<{ n: number }>(
			`select count(*)::int as n from clients where email = $1`,
			[client.email]
		);
		expect(left[0]!.n).toBe(0);
	});
}
