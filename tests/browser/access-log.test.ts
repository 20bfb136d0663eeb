import { readFile } from 'node:fs/promises';
import { expect, test } from './support/test';
import { expectAccessible } from './a11y';
import { signIn } from './support/signin';

// The studio admin (also an instructor) reads a client record, then reviews the log: filter by
// that client, page forward without a reload, export the CSV, verify the chain — at desktop
// and phone widths.
for (const [label, width, height] of [
	['desktop', 1280, 900],
	['phone', 390, 844]
] as const) {
	test(`the access log at ${label} width: filter by client, page, export, verify`, async ({
		page
	}) => {
		test.setTimeout(180_000); // sign-in, two record reads, export and verify on a busy machine
		await page.setViewportSize({ width, height });
		await signIn(page, 'admin@studio.example');
		await page.goto('/clients');
		await page
			.getByRole('link', { name: /Maya Okonjo/ })
			.first()
			.click();
		await expect(page.getByRole('heading', { level: 1, name: /Maya Okonjo/ })).toBeVisible();
		await page.goto('/clients');
		await page
			.getByRole('link', { name: /Maya Okonjo/ })
			.first()
			.click();
		await expect(page.getByRole('heading', { level: 1, name: /Maya Okonjo/ })).toBeVisible();

		await page.goto('/admin');
		await page.getByRole('link', { name: 'Review the access log' }).click();
		await expect(page.getByRole('heading', { level: 1, name: 'Access log' })).toBeVisible();
		await expectAccessible(page);

		// Filter by client: her name in "Whose data" narrows the log to her events.
		const events = page.locator(width >= 768 ? 'tbody tr[data-event]' : 'li[data-event]');
		await events.getByRole('link', { name: 'Maya Okonjo' }).first().click();
		await expect(page).toHaveURL(/client=/);
		await expect(page.getByText('Client: Maya Okonjo')).toBeVisible();
		await page.goto(page.url() + '&limit=1');
		await expect(events).toHaveCount(1);

		// Page forward: the older event is appended in place (no navigation).
		const before = page.url();
		await page.getByRole('link', { name: 'Older events' }).click();
		await expect(events).toHaveCount(2);
		expect(page.url()).toBe(before);
		await expectAccessible(page);
		await page.screenshot({ path: `test-results/access-log-${label}.png`, fullPage: true });

		// Export: a CSV named after the organisation, with the header row.
		const [download] = await Promise.all([
			page.waitForEvent('download'),
			page.getByRole('link', { name: 'Export CSV' }).click()
		]);
		expect(download.suggestedFilename()).toMatch(/^access-log_linden-row-studio_start_to_/);
		const csv = await readFile((await download.path())!, 'utf8');
		expect(csv.split('\r\n')[0]).toContain('"id","at","actor_id"');
		expect(csv).toContain('Maya Okonjo');

		// Verify: the chain and its anchored heads hold.
		await page.getByRole('button', { name: 'Verify the log' }).click();
		await expect(page.getByRole('status')).toContainText('Intact:', { timeout: 30_000 });
		await expectAccessible(page);
		await page.screenshot({
			path: `test-results/access-log-verified-${label}.png`,
			fullPage: true
		});
	});
}
