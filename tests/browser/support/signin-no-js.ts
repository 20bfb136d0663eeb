import { expect, type Page } from '@playwright/test';
import { countMail, forgetSignInRequests, linkIn, waitForNewMail } from './signin';

/** Signs in through the mail link with scripts off: every step is a plain form post. */
export async function signInWithoutScript(page: Page, email: string): Promise<void> {
	await forgetSignInRequests(email);
	const seen = await countMail(email);
	await page.goto('/signin');
	await page.getByLabel('E-mail address').fill(email);
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(page).toHaveURL(/\/signin\/sent$/);
	const mail = await waitForNewMail(email, 'Your Seamwell sign-in link', seen);
	await page.goto(linkIn(mail, '/signin/confirm'));
	await page.getByRole('button', { name: 'Sign in to Seamwell' }).click();
	await page.waitForURL((url) => !url.pathname.startsWith('/signin'));
	await expect(
		page.getByRole('button', { name: 'Sign out', includeHidden: true }).first()
	).toBeAttached();
}
