import { expect, test } from './support/test';
import { expectAccessible } from './a11y';
import { signIn } from './support/signin';

// A client added without her intake consent: her page offers the consent form (loaded only while
// it is needed), names a missing date in the error summary (loaded when the answer has errors)
// and, once the consent is recorded, drops the form and offers a screening.

const yesterday = () => new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);

test('an instructor records a client’s intake consent on her page, after a missing date is named', async ({
	page
}) => {
	const name = `Ilse Marrow ${Date.now().toString(36)}`;
	await signIn(page, 'instructor@studio.example');

	await page.goto('/clients/new');
	await page.getByLabel('Name').fill(name);
	await page.getByLabel('Pregnant').check();
	await page
		.getByLabel('Due date')
		.fill(new Date(Date.now() + 90 * 86_400_000).toISOString().slice(0, 10));
	await page.getByLabel('How she agreed').selectOption('');
	await page.getByRole('button', { name: 'Add client' }).click();
	await page.waitForURL(/\/clients\/[0-9a-f-]{36}$/);
	await expect(page.getByRole('heading', { level: 1, name })).toBeVisible();

	await expect(
		page.getByText('Not recorded yet. It is needed before her first screening.')
	).toBeVisible();
	await expect(page.getByRole('link', { name: 'Record a screening' })).toHaveCount(0);
	await expect(page.getByTestId('error-summary')).toHaveCount(0);
	await expectAccessible(page);

	await page.getByLabel('How she agreed').selectOption('in_person');
	await page.getByLabel('On', { exact: true }).fill('');
	await page.getByRole('button', { name: 'Record consent' }).click();
	const summary = page.getByTestId('error-summary');
	await expect(summary).toContainText('Consent date');
	await expect(summary).toContainText('Enter the day she agreed');
	await expect(summary).toBeFocused();
	await expectAccessible(page);

	await page.getByLabel('On', { exact: true }).fill(yesterday());
	await page.getByRole('button', { name: 'Record consent' }).click();
	await expect(
		page.getByText(/She agreed to the studio recording her screenings on/)
	).toBeVisible();
	await expect(page.getByRole('button', { name: 'Record consent' })).toHaveCount(0);
	await expect(page.getByTestId('error-summary')).toHaveCount(0);
	await expect(page.getByRole('link', { name: 'Record a screening' })).toBeVisible();
});
