import { expect, test } from './support/test';
import { signIn, sql } from './support/signin';

// The admin dashboard lists mail to her organisation's people that failed for 48 hours, and
// sends it again.

test('an admin sees failed mail and sends it again', async ({ page }) => {
	// Sign-in, two page checks with axe and two screenshots: generous on a busy machine.
	test.setTimeout(120_000);
	const [mail] = await sql<{ id: string }>(
		`insert into outbox ("to", subject, text, kind, state, attempts, last_error, created_at)
		 values ('physio@clinic.example', 'There is something new for you in Seamwell', 'x',
		         'referral.received', 'failed', 191, 'connect ECONNREFUSED 127.0.0.1:1025',
		         now() - interval '49 hours')
		 returning id`
	);
	await signIn(page, 'admin@clinic.example');
	await page.goto('/admin');
	const card = page.locator('section', {
		has: page.getByRole('heading', { name: 'Mail that could not be delivered' })
	});
	await expect(card.getByText('physio@clinic.example').first()).toBeVisible();
	await expect(card.getByText(/Last error: connect ECONNREFUSED/).first()).toBeVisible();
	for (const width of [390, 1280]) {
		await page.setViewportSize({ width, height: 900 });
		await page.screenshot({ path: `test-results/admin-failed-mail-${width}.png`, fullPage: true });
	}
	await card
		.locator('li', { has: page.locator(`input[value="${mail!.id}"]`) })
		.getByRole('button', { name: /Send again/ })
		.click();
	await expect(card.getByRole('status')).toContainText('Queued again');
	const [row] = await sql<{ state: string }>('select state::text from outbox where id = $1', [
		mail!.id
	]);
	expect(['pending', 'sent']).toContain(row!.state);
});
