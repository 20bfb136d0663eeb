import { readFile } from 'node:fs/promises';
import { expect, test } from './support/test';
import { expectAccessible } from './a11y';
import { signIn } from './support/signin';

// The client's privacy page: who accessed her record (her instructor's reads among them) and
// "Download my data" — at a phone's and a desktop's width.

for (const [label, width, height] of [
	['desktop', 1280, 900],
	['phone', 390, 844]
] as const) {
	test(`a client sees who accessed her record and downloads her data (${label})`, async ({
		page
	}) => {
		test.setTimeout(120_000);
		await page.setViewportSize({ width, height });
		// Her instructor opens her record first, so the list has that read in it.
		await signIn(page, 'instructor@studio.example');
		await page.goto('/clients');
		await page
			.getByRole('link', { name: /Hana Lindqvist/ })
			.first()
			.click();
		await expect(page.getByRole('heading', { level: 1, name: /Hana Lindqvist/ })).toBeVisible();
		await page.context().clearCookies();

		await signIn(page, 'client@client.example');
		await page.goto('/client');
		await page.getByRole('link', { name: 'See who accessed my record' }).click();
		await expect(page.getByRole('heading', { level: 1, name: 'Privacy' })).toBeVisible();
		const entries = page.getByTestId('access-entry');
		await expect(entries.filter({ hasText: 'Opened a client record' }).first()).toBeVisible();
		await expect(entries.filter({ hasText: 'Linden Row Studio' }).first()).toBeVisible();
		await expectAccessible(page);
		await page.screenshot({ path: `test-results/privacy-${label}.png`, fullPage: true });

		const [download] = await Promise.all([
			page.waitForEvent('download'),
			page.getByRole('link', { name: 'Download my data (JSON)' }).click()
		]);
		expect(download.suggestedFilename()).toMatch(/^seamwell-my-data-\d{4}-\d{2}-\d{2}\.json$/);
		const data = JSON.parse(await readFile((await download.path())!, 'utf8')) as {
			format: string;
			client: { name: string };
			screenings: unknown;
		};
		expect(data.format).toBe('seamwell.client-export');
		expect(data.client.name).toBe('Hana Lindqvist');

		const [fhirDownload] = await Promise.all([
			page.waitForEvent('download'),
			page.getByRole('link', { name: 'Download as FHIR R4' }).click()
		]);
		const bundle = JSON.parse(await readFile((await fhirDownload.path())!, 'utf8')) as {
			resourceType: string;
			type: string;
			entry: Array<{ resource: { resourceType: string } }>;
		};
		expect(bundle).toMatchObject({ resourceType: 'Bundle', type: 'collection' });
		expect(bundle.entry[0]!.resource.resourceType).toBe('Patient');
	});
}
