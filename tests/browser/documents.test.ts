import { readFileSync } from 'node:fs';
import type { Browser, Page } from '@playwright/test';
import { expect, test, waitingForHydration } from './support/test';
import { paddedPdf, pdfText, validPdf } from '../fixtures/pdf';
import { expectAccessible } from './a11y';
import { signIn, sql } from './support/signin';

// Assessment documents in the browser: the physiotherapist uploads a PDF with the progress
// bar and shares it with the studio, adds a clinic-only one through the plain form (no
// JavaScript), and the instructor sees only the shared one with its summary, downloads it
// stamped with her name, and downloads the referral letter.
//
// The referral is the demo's accepted one (Maya Okonjo, Linden Row Studio → Fernbank Pelvic
// Health, consent active; src/lib/server/demo/referrals.ts). Each run uploads files with
// names of its own.

const PHYSIO = 'physio@clinic.example';
const INSTRUCTOR = 'instructor@studio.example';

async function personPage(browser: Browser, email: string): Promise<Page> {
	const page = await (await browser.newContext()).newPage();
	await signIn(page, email);
	// Like the fixture's page: goto returns once the page has hydrated.
	return waitingForHydration(page);
}

test('physio uploads with a progress bar and shares one document; the instructor downloads it stamped', async ({
	browser
}) => {
	test.setTimeout(120_000);
	const tag = Date.now().toString(36);
	const sharedName = `Assessment summary ${tag}.pdf`;
	const clinicName = `Clinic notes ${tag}.pdf`;
	const summary = `Low-load work only until her review (${tag}).`;
	const [referral] = await sql<{ id: string }>(
		`select r.id from referrals r join clients c on c.id = r.client_id
		 where c.name = 'Maya Okonjo' and r.state = 'accepted' limit 1`
	);
	expect(referral, 'the demo has an accepted referral for Maya Okonjo').toBeTruthy();
	const path = `/referrals/${referral!.id}`;

	// 1. The physiotherapist uploads a 3 MB PDF over a slowed connection, watching the bar.
	const physio = await personPage(browser, PHYSIO);
	await physio.goto(path);
	await expect(physio.getByRole('heading', { name: 'Documents' })).toBeVisible();
	await expect(physio.getByText('the stamp breaks any digital signature')).toBeVisible();
	await expect(physio.getByRole('complementary', { name: 'Caution' })).toBeVisible();
	await expectAccessible(physio);
	await physio.evaluate(() => {
		const seen: number[] = [];
		(window as unknown as { uploadProgress: number[] }).uploadProgress = seen;
		const send = XMLHttpRequest.prototype.send;
		XMLHttpRequest.prototype.send = function (this: XMLHttpRequest, body) {
			this.upload.addEventListener('progress', (e) => seen.push(e.loaded));
			return send.call(this, body);
		};
	});
	const cdp = await physio.context().newCDPSession(physio);
	await cdp.send('Network.enable');
	await cdp.send('Network.emulateNetworkConditions', {
		offline: false,
		latency: 20,
		downloadThroughput: -1,
		uploadThroughput: 1024 * 1024
	});
	await physio.getByLabel('PDF file').setInputFiles({
		name: sharedName,
		mimeType: 'application/pdf',
		buffer: Buffer.from(paddedPdf(3 * 1024 * 1024))
	});
	const uploadForm = physio.locator('form[action="?/upload"]');
	await uploadForm.getByLabel('Shareable with the studio').check();
	await physio.getByLabel('Summary for the instructor (optional)').fill(summary);
	await physio.getByRole('button', { name: 'Upload document' }).click();
	const bar = physio.getByRole('progressbar', { name: 'Upload progress' });
	await expect(bar).toBeVisible();
	await expect
		.poll(async () => Number(await bar.getAttribute('value')), { timeout: 10_000 })
		.toBeGreaterThan(0);
	await expect(physio.getByText(/^\d+% uploaded$/)).toBeVisible();
	await physio.screenshot({ path: 'test-results/documents-uploading.png', fullPage: true });
	await expect(physio.getByText(`Uploaded ${sharedName}.`)).toBeVisible({ timeout: 30_000 });
	await expect(physio.getByText('100% uploaded')).toBeVisible();
	const progress = await physio.evaluate(
		() => (window as unknown as { uploadProgress: number[] }).uploadProgress
	);
	expect(progress.length).toBeGreaterThan(1);
	await cdp.send('Network.emulateNetworkConditions', {
		offline: false,
		latency: 0,
		downloadThroughput: -1,
		uploadThroughput: -1
	});
	const sharedItem = physio.locator('li[data-document]', { hasText: sharedName });
	await expect(sharedItem.locator('[data-share="studio"]')).toHaveText('Shared with the studio');
	await expect(sharedItem).toContainText(summary);
	await expectAccessible(physio);

	// A refused file says why, and nothing appears in the list.
	await physio.getByLabel('PDF file').setInputFiles({
		name: `not-really-${tag}.pdf`,
		mimeType: 'application/pdf',
		buffer: Buffer.from('Client notes: 2 finger widths above the navel\n')
	});
	await physio.getByRole('button', { name: 'Upload document' }).click();
	await expect(physio.getByTestId('documents-message')).toContainText('This file is not a PDF');
	await expect(physio.getByTestId('documents-message')).toContainText('Nothing was saved');
	await expect(physio.locator('li[data-document]', { hasText: `not-really-${tag}` })).toHaveCount(
		0
	);
	await physio.screenshot({ path: 'test-results/documents-physio.png', fullPage: true });

	// 2. Without JavaScript, the same form uploads a clinic-only document.
	const plain = await (
		await browser.newContext({
			javaScriptEnabled: false,
			storageState: await physio.context().storageState()
		})
	).newPage();
	await plain.goto(path);
	await plain.getByLabel('PDF file').setInputFiles({
		name: clinicName,
		mimeType: 'application/pdf',
		buffer: Buffer.from(await validPdf({ pages: 2 }))
	});
	await plain.getByRole('button', { name: 'Upload document' }).click();
	await expect(plain.getByText(`Uploaded ${clinicName}.`)).toBeVisible();
	await expect(
		plain.locator('li[data-document]', { hasText: clinicName }).locator('[data-share]')
	).toHaveText('Clinic only');
	await plain.context().close();

	// 3. The instructor sees the shared document and its summary, never the clinic-only one.
	const instructor = await personPage(browser, INSTRUCTOR);
	await instructor.goto(path);
	const forStudio = instructor.locator('li[data-document]', { hasText: sharedName });
	await expect(forStudio).toBeVisible();
	await expect(
		forStudio.getByRole('heading', { name: 'Summary from the physiotherapist' })
	).toBeVisible();
	await expect(forStudio).toContainText(summary);
	await expect(instructor.getByText(clinicName)).toHaveCount(0);
	await expect(instructor.getByText('Pelvic floor assessment notes.pdf')).toHaveCount(0);
	await expect(instructor.getByRole('button', { name: 'Upload document' })).toHaveCount(0);
	await expect(instructor.getByRole('complementary', { name: 'Caution' })).toBeVisible();
	await expectAccessible(instructor);
	await instructor.screenshot({ path: 'test-results/documents-instructor.png', fullPage: true });

	const [download] = await Promise.all([
		instructor.waitForEvent('download'),
		forStudio.getByRole('link', { name: `Download ${sharedName}` }).click()
	]);
	expect(download.suggestedFilename()).toBe(sharedName);
	const stamped = readFileSync((await download.path())!);
	expect(stamped.subarray(0, 5).toString('latin1')).toBe('%PDF-');
	const text = pdfText(stamped, 1);
	expect(text).toContain('Downloaded by Tess Almeida (Linden Row Studio)');
	expect(text).toMatch(/on \d{1,2} \w{3} \d{4}, \d{2}:\d{2} UTC/);

	const [letter] = await Promise.all([
		instructor.waitForEvent('download'),
		instructor.getByRole('link', { name: 'Download the referral letter (PDF)' }).click()
	]);
	expect(letter.suggestedFilename()).toMatch(/^referral-letter-\d{4}-\d{2}-\d{2}\.pdf$/);
	expect(pdfText(readFileSync((await letter.path())!))).toContain('Maya Okonjo');

	// The downloads answer as attachments that are never sniffed.
	const response = await instructor.request.get(
		`/api/v1/documents/${await forStudio.getAttribute('data-document')}`
	);
	expect(response.status()).toBe(200);
	expect(response.headers()['content-disposition']).toMatch(/^attachment; filename=/);
	expect(response.headers()['x-content-type-options']).toBe('nosniff');
	expect(response.headers()['content-type']).toBe('application/pdf');
});

test('requests other than uploads are capped at 1 MB with a problem document', async ({
	browser
}) => {
	const page = await personPage(browser, INSTRUCTOR);
	const response = await page.request.post('/api/v1/referrals', {
		headers: { 'content-type': 'application/json', origin: new URL(page.url()).origin },
		data: JSON.stringify({ reason: 'x'.repeat(2 * 1024 * 1024) })
	});
	expect(response.status()).toBe(413);
	expect(response.headers()['content-type']).toBe('application/problem+json');
	expect(((await response.json()) as { type: string }).type).toBe('/problems/payload-too-large');
});
