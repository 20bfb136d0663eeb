import { expect, test } from './support/test';
import { expectAccessible } from './a11y';
import { signIn } from './support/signin';

// The studio's exercise library: an empty form names every missing field; copying a shipped
// exercise prefills the form; the studio's copy appears marked as its own and can be picked in
// the plan editor's library — at a phone's and a desktop's width.

for (const [label, width, height] of [
	['desktop', 1280, 900],
	['phone', 390, 844]
] as const) {
	test(`an instructor copies a shipped exercise into her studio's library (${label})`, async ({
		page
	}) => {
		test.setTimeout(120_000);
		await page.setViewportSize({ width, height });
		await signIn(page, 'instructor@studio.example');
		await page.goto('/plans');
		await page.getByRole('link', { name: 'Exercise library' }).click();
		await expect(page.getByRole('heading', { level: 1, name: 'Exercise library' })).toBeVisible();
		await expectAccessible(page);

		// An empty form: every missing field at once, in words for people.
		await page.getByText('Add your studio’s own exercise').click();
		await page.getByRole('button', { name: 'Add to the library' }).click();
		await expect(page.getByRole('alert')).toContainText('Give the exercise a name');
		await expect(page.getByRole('alert')).toContainText('Choose the position');

		// Copy a shipped one: the form comes prefilled; her version gets its own name.
		await page.goto('/plans/library?category=deep_stability');
		await page
			.getByRole('link', { name: /^Copy to adapt/ })
			.first()
			.click();
		await expect(page.getByText(/Adapt a copy of/)).toBeVisible();
		const name = `Studio breath drill ${label} ${Date.now().toString(36)}`;
		await page.getByLabel('Name').fill(name);
		await expectAccessible(page);
		await page.getByRole('button', { name: 'Add to the library' }).click();
		await expect(
			page.getByRole('status').filter({ hasText: 'Added to your studio’s library' })
		).toBeVisible();
		const card = page.locator('li', { hasText: name });
		await expect(card.getByText('Your studio')).toBeVisible();
		await page.screenshot({ path: `test-results/exercise-library-${label}.png`, fullPage: true });

		// The plan editor's library finds it.
		await page.goto('/plans');
		await page.getByRole('link', { name: 'Tuesday postnatal mat class' }).click();
		await page.locator('#lib-q').fill(name.slice(0, 20));
		await expect(page.getByText(name).first()).toBeVisible();

		// Who the plan is for: add a client, save, and take her off again (the demo stays as it was).
		await page.getByText(/^Who it is for/).click();
		// Bea Sorensen: a demo client with intake consent who is not in the class.
		const bea = page.getByRole('checkbox', { name: 'Bea Sorensen' });
		await bea.check();
		await page.getByRole('button', { name: 'Save who it is for' }).click();
		const said = page.locator('p[role=status]').filter({ hasText: 'Who the plan is for is saved' });
		await expect(said).toHaveCount(1);
		await expect(page.getByTestId('cell-0-Bea')).toBeVisible();
		await bea.uncheck();
		await page.getByRole('button', { name: 'Save who it is for' }).click();
		await expect(page.getByTestId('cell-0-Bea')).toHaveCount(0);
		await expectAccessible(page);
	});
}
