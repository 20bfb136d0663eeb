import { expect, test } from './support/test';
import { expectAccessible } from './a11y';
import { countMail, linkIn, signIn, waitForNewMail } from './support/signin';

const INVITE_SUBJECT = 'You are invited to';

test('an invitation is sent, accepted, and the new member signs in to her dashboard', async ({
	page,
	browser
}) => {
	const invitee = `new-instructor-${Date.now()}@test.example`;
	await signIn(page, 'admin@studio.example');
	await page.getByRole('link', { name: 'Members', exact: true }).click();
	await page.getByLabel('E-mail address').fill(invitee);
	await page.getByLabel('Role', { exact: true }).selectOption('instructor');
	await page.getByRole('button', { name: 'Send invitation' }).click();
	await expect(page.getByRole('status')).toHaveText('Invitation sent.');
	await expect(page.getByRole('cell', { name: invitee, exact: true })).toBeVisible();
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/members-invited.png', fullPage: true });

	const mail = await waitForNewMail(invitee, INVITE_SUBJECT, 0);
	const link = linkIn(mail, '/invite/');

	const theirs = await browser.newContext();
	const newcomer = await theirs.newPage();
	await newcomer.goto(link);
	await expect(newcomer.getByRole('heading', { name: 'Join Linden Row Studio' })).toBeVisible();
	await expectAccessible(newcomer);
	await newcomer.screenshot({ path: 'test-results/invitation.png', fullPage: true });
	const seen = await countMail(invitee);
	await newcomer.getByRole('button', { name: 'Accept the invitation' }).click();
	await expect(newcomer).toHaveURL(/\/signin\/sent$/);
	const signInMail = await waitForNewMail(invitee, 'Your Seamwell sign-in link', seen);
	await newcomer.goto(linkIn(signInMail, '/signin/confirm'));
	await newcomer.getByRole('button', { name: 'Sign in to Seamwell' }).click();
	await expect(newcomer).toHaveURL(/\/instructor$/);
	await expect(newcomer.getByRole('heading', { name: 'Instructor dashboard' })).toBeVisible();

	// The link worked once.
	await newcomer.goto(link);
	await expect(
		newcomer.getByRole('heading', { name: 'This invitation cannot be used' })
	).toBeVisible();

	// The admin sees the new member, deactivates her, and her session ends at once.
	await page.reload();
	await expect(page.getByRole('cell', { name: invitee, exact: true })).toHaveCount(1);
	// A destructive step asks once more.
	await page
		.locator('summary')
		.filter({ hasText: 'Deactivate…' })
		.filter({ hasText: invitee })
		.click();
	await page.getByRole('button', { name: new RegExp(`Yes, deactivate ${invitee}`) }).click();
	await expect(page.getByRole('status')).toContainText('Member deactivated');
	await newcomer.goto('/instructor');
	await expect(newcomer).toHaveURL(/\/signin\?callbackUrl=/);
	await theirs.close();
});

test('a pending invitation is revoked and its link then says so', async ({ page }) => {
	const invitee = `revoked-${Date.now()}@test.example`;
	await signIn(page, 'admin@clinic.example');
	await page.goto('/admin/members');
	await page.getByLabel('E-mail address').fill(invitee);
	await page.getByLabel('Role', { exact: true }).selectOption('physiotherapist');
	await page.getByRole('button', { name: 'Send invitation' }).click();
	await expect(page.getByRole('cell', { name: invitee, exact: true })).toBeVisible();
	const link = linkIn(await waitForNewMail(invitee, INVITE_SUBJECT, 0), '/invite/');

	await page.locator('summary').filter({ hasText: 'Revoke…' }).filter({ hasText: invitee }).click();
	await page.getByRole('button', { name: `Revoke the invitation for ${invitee}` }).click();
	await expect(page.getByRole('status')).toHaveText('Invitation revoked.');
	await expect(page.getByRole('cell', { name: invitee, exact: true })).toHaveCount(0);

	await page.goto(link);
	await expect(page.getByText('This invitation was withdrawn')).toBeVisible();
	await expectAccessible(page);
});

test('an admin changes a member’s role', async ({ page }) => {
	await signIn(page, 'admin@clinic.example');
	await page.goto('/admin/members');
	const role = page.getByLabel('Role of Dr Ilse Marchetti');
	await role.selectOption('admin');
	await page.getByRole('button', { name: 'Change the role of Dr Ilse Marchetti' }).click();
	await expect(page.getByRole('status')).toHaveText('Role changed.');
	await expect(page.getByLabel('Role of Dr Ilse Marchetti')).toHaveValue('admin');
	// And back, leaving the demo as it was.
	await page.getByLabel('Role of Dr Ilse Marchetti').selectOption('physiotherapist');
	await page.getByRole('button', { name: 'Change the role of Dr Ilse Marchetti' }).click();
	await expect(page.getByLabel('Role of Dr Ilse Marchetti')).toHaveValue('physiotherapist');
});

test('an invitation to an address with a bad form gets a plain message', async ({ page }) => {
	await signIn(page, 'admin@clinic.example');
	await page.goto('/admin/members');
	await page.getByLabel('E-mail address').fill('not-an-address');
	await page.getByRole('button', { name: 'Send invitation' }).click();
	await expect(page.getByText('not a valid e-mail address')).toBeVisible();
});
