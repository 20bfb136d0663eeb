import type { Browser, Page } from '@playwright/test';
import { expect, test, waitingForHydration } from './support/test';
import { expectAccessible } from './a11y';
import { inbox, linkIn, signIn, sql, waitForNewMail } from './support/signin';

// The referral loop across three people, each signing in through the real e-mail link:
// the instructor drafts a referral for Hana, asks her for consent; Hana consents from the
// e-mail; the instructor sends; the physiotherapist's open inbox shows it without a reload
// (a background refresh), she accepts; the instructor sees "accepted" and has the mail.

// Each kind of notice has its own subject, so a reader can triage her inbox.
const ASKED = 'Your studio asks before sharing your record';
const RECEIVED = 'A referral for your clinic';
const ACCEPTED = 'Your referral was accepted';
const SHARING_ENDED = 'Sharing ended for one of your referrals';
const INSTRUCTOR = 'instructor@studio.example';
const CLIENT = 'client@client.example';
const PHYSIO = 'physio@clinic.example';

async function personPage(browser: Browser, email: string): Promise<Page> {
	const context = await browser.newContext();
	const page = await context.newPage();
	await signIn(page, email);
	// Like the fixture's page: goto returns once the page has hydrated.
	return waitingForHydration(page);
}

const notices = async (address: string, subject: string) =>
	(await inbox(address)).filter((m) => m.subject.startsWith(subject)).length;

test('instructor drafts, client consents from the e-mail, instructor sends, physio accepts', async ({
	browser
}) => {
	test.setTimeout(120_000);
	// Each run starts with Hana sharing nothing with the clinic (an earlier run may have left
	// a consent in force): withdraw what is there, as she could herself.
	await sql(
		`update consents set withdrawn_at = now()
		 where withdrawn_at is null and client_id = (select id from clients where email = $1)`,
		[CLIENT]
	);

	// 1. The instructor drafts a referral.
	const instructor = await personPage(browser, INSTRUCTOR);
	await instructor.goto('/referrals/new');
	await expect(instructor).toHaveTitle('New referral — Seamwell');
	await instructor.getByRole('button', { name: 'Save draft' }).click();
	await expect(instructor.getByRole('alert')).toContainText('fields need attention');
	await expect(instructor.locator('#reason-error')).toHaveText('Write why you are referring her');

	const clientOption = instructor.locator('#clientId option', { hasText: 'Hana Lindqvist' });
	await instructor.locator('#clientId').selectOption((await clientOption.getAttribute('value'))!);
	await instructor.getByLabel('Clinic').selectOption({ label: 'Fernbank Pelvic Health' });
	await instructor
		.getByLabel('Physiotherapist (optional)')
		.selectOption({ label: 'Dr Ilse Marchetti' });
	await instructor.getByLabel('Soon').check();
	await instructor
		.getByLabel('Reason for the referral')
		.fill('Gap of three finger widths at the navel, soft midline, doming on the curl-up.');
	await instructor.getByLabel('Pelvic heaviness or dragging').check();
	await expectAccessible(instructor);
	await instructor.getByRole('button', { name: 'Save draft' }).click();
	await instructor.waitForURL(/\/referrals\/[0-9a-f-]{36}$/);
	const referralId = instructor.url().split('/').at(-1)!;
	await expect(instructor).toHaveTitle('Referral for Hana Lindqvist — Seamwell');
	await expect(instructor.locator('[data-state="draft"]')).toBeVisible();
	await expect(instructor.getByText('The client has not consented to share')).toBeVisible();
	await expect(instructor.getByRole('complementary', { name: 'Caution' })).toBeVisible();

	// Sending without consent is refused, with the offer to ask her.
	await instructor.getByRole('button', { name: 'Send referral' }).click();
	await expect(instructor.getByRole('alert')).toContainText('has not consented');
	const asked = await notices(CLIENT, ASKED);
	await instructor.getByRole('button', { name: 'Ask her for consent by e-mail' }).first().click();
	await expect(instructor.getByText('We have e-mailed the client')).toBeVisible();
	await expectAccessible(instructor);
	await instructor.screenshot({ path: 'test-results/referral-draft.png', fullPage: true });

	// 2. The physiotherapist's inbox is open; the draft is not in it.
	const physio = await personPage(browser, PHYSIO);
	const backgroundRefreshes: string[] = [];
	physio.on('request', (request) => {
		if (
			request.url().includes('/api/v1/referrals') &&
			request.headers()['x-seamwell-background'] === '1'
		) {
			backgroundRefreshes.push(request.url());
		}
	});
	await physio.goto('/referrals');
	await expect(physio).toHaveTitle('Referral inbox — Seamwell');
	await expect(physio.getByRole('status')).toContainText('The list refreshes itself');
	await expect(physio.locator(`[data-referral="${referralId}"]`)).toHaveCount(0);

	// 3. Hana follows the e-mail, reads what would be shared, and consents with one click.
	const mail = await waitForNewMail(CLIENT, ASKED, asked);
	expect(mail.text).not.toContain('finger');
	expect(mail.text).not.toContain('Fernbank');
	const link = linkIn(mail, '/consents');
	const client = await personPage(browser, CLIENT);
	await client.goto(link);
	await expect(client).toHaveTitle('Your consents to share — Seamwell');
	const request = client.getByRole('region', { name: /asks you to share with Fernbank/ });
	await expect(request).toContainText('from your studio to the clinic');
	await expect(request).toContainText('from the clinic to your studio');
	await expectAccessible(client);
	await client.screenshot({ path: 'test-results/consent-request.png', fullPage: true });
	await request
		.getByRole('button', { name: 'Give consent to share with Fernbank Pelvic Health' })
		.click();
	await expect(client.getByText('Your consent is recorded')).toBeVisible();
	await expect(client.getByText('Withdraw consent for Fernbank Pelvic Health…')).toBeVisible();
	await expectAccessible(client);
	await client.screenshot({ path: 'test-results/consent-given.png', fullPage: true });

	// 4. The instructor sends it.
	await instructor.reload();
	await expect(instructor.getByText('The client consents to share')).toBeVisible();
	const received = await notices(PHYSIO, RECEIVED);
	await instructor.getByRole('button', { name: 'Send referral' }).click();
	await expect(instructor.getByText('Done: the referral is now sent')).toBeVisible();
	await waitForNewMail(PHYSIO, RECEIVED, received);

	// 5. It appears in the open inbox without a reload, by a background refresh.
	const row = physio.locator(`[data-referral="${referralId}"]`);
	await expect(row).toBeVisible({ timeout: 30_000 });
	expect(backgroundRefreshes.length).toBeGreaterThan(0);
	await expect(row).toContainText('Hana Lindqvist');
	await expect(row).toContainText('Soon');
	await expectAccessible(physio);
	await physio.screenshot({ path: 'test-results/referral-inbox.png', fullPage: true });

	await row.getByRole('link', { name: 'Hana Lindqvist' }).click();
	await physio.waitForURL(`**/referrals/${referralId}`);
	await expect(physio.getByText('Shared with your clinic on')).toBeVisible();
	await expect(physio.getByText('Pelvic heaviness or dragging').first()).toBeVisible();
	await expect(physio.locator('#chart-at_navel-title')).toHaveText('At the navel');
	await expect(physio.getByRole('complementary', { name: 'Caution' })).toBeVisible();
	await expectAccessible(physio);
	await physio.screenshot({ path: 'test-results/referral-physio.png', fullPage: true });
	const told = await notices(INSTRUCTOR, ACCEPTED);
	await physio.getByRole('button', { name: 'Accept' }).click();
	await expect(physio.getByText('Done: the referral is now accepted')).toBeVisible();

	// 6. The instructor sees "accepted", and the mail that says so (without details).
	const notice = await waitForNewMail(INSTRUCTOR, ACCEPTED, told);
	expect(notice.text).toContain(`/referrals/${referralId}`);
	expect(notice.text).not.toContain('Hana');
	await instructor.goto('/referrals');
	await expect(
		instructor.locator(`[data-referral="${referralId}"] [data-state="accepted"]`)
	).toBeVisible();
	await instructor.goto(`/referrals/${referralId}`);
	await expect(instructor.locator('[data-state="accepted"]')).toBeVisible();
	await expectAccessible(instructor);
	await instructor.screenshot({ path: 'test-results/referral-accepted.png', fullPage: true });

	// Withdrawing is as easy as giving, but informed: the confirmation names what ends. The
	// accepted referral is withdrawn, and the instructor is told as well as the physio.
	await client.reload();
	const endedBefore = await notices(INSTRUCTOR, SHARING_ENDED);
	await client.getByText('Withdraw consent for Fernbank Pelvic Health…').click();
	await expect(
		client.getByText('Your referral to Fernbank Pelvic Health (accepted by the clinic) ends.')
	).toBeVisible();
	await expectAccessible(client);
	await client.screenshot({ path: 'test-results/consent-withdraw-confirm.png', fullPage: true });
	await client
		.getByRole('button', { name: 'Yes, stop sharing with Fernbank Pelvic Health' })
		.click();
	await expect(client.getByText('Your consent is withdrawn')).toBeVisible();
	const ended = await waitForNewMail(INSTRUCTOR, SHARING_ENDED, endedBefore);
	expect(ended.text).not.toContain('Hana');
	await instructor.reload();
	await expect(instructor.locator('[data-state="withdrawn"]')).toBeVisible();
	await expect(instructor.getByText('“consent withdrawn”')).toBeVisible();
});

test('on the studio’s side of a referral, what the clinic sent back comes before withdrawing', async ({
	page
}) => {
	// Demo: Maya Okonjo's referral, accepted by Fernbank Pelvic Health.
	await signIn(page, INSTRUCTOR);
	await page.goto('/referrals');
	await page.getByRole('link', { name: 'Maya Okonjo' }).first().click();
	const documents = page.getByRole('heading', { name: 'Documents', level: 2 });
	const withdraw = page.getByRole('heading', { name: 'Withdraw this referral' });
	await expect(withdraw).toBeVisible();
	const [docsBox, withdrawBox] = await Promise.all([
		documents.boundingBox(),
		withdraw.boundingBox()
	]);
	expect(docsBox!.y).toBeLessThan(withdrawBox!.y);
	// Withdrawing is her only step here, so nothing else leads the page.
	await expect(page.getByRole('heading', { name: 'What you can do' })).toHaveCount(0);
	await expect(page.getByRole('button', { name: 'Withdraw referral' })).toBeVisible();
	await expectAccessible(page);
});
