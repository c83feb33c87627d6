import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appUrl, launch, screenshot, signIn, watchForErrors } from './browser';
import { firstLink, waitForMail } from './mail';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser?.close();
});

const stamp = Date.now();
const owner = {
	name: 'Ola Nordmark',
	email: `ola-${stamp}@example.test`,
	password: 'first-user-password'
};
const second = {
	name: 'Kari Fjell',
	email: `kari-${stamp}@example.test`,
	password: 'second-user-password'
};
const slug = `test-basin-${stamp}`;

async function signUp(page: Page, who: typeof owner) {
	await page.goto(`${appUrl()}/sign-up`);
	await page.getByLabel('Your name').fill(who.name);
	await page.getByLabel('E-mail address').fill(who.email);
	await page.getByLabel('Password', { exact: true }).fill(who.password);
	await page.getByLabel('Password again').fill(who.password);
	await page.getByRole('button', { name: 'Create account' }).click();
	await page.waitForURL(/\/verify-email\?sent=/);
}

async function verifyFromMail(page: Page, who: typeof owner) {
	const mail = await waitForMail(who.email, 'Confirm your e-mail address');
	expect(mail.html).toContain('Thermalith');
	await page.goto(firstLink(mail.text));
	await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe(
		'Address confirmed'
	);
}

describe('accounts and organisations, as users would do it', () => {
	it('sign up, verify, create an organisation, invite, accept, change the role, sign out', async () => {
		const ownerContext = await browser.newContext();
		const page = await ownerContext.newPage();
		const errors = watchForErrors(page);

		await signUp(page, owner);
		await verifyFromMail(page, owner);
		// Verification signs the user in; sign out and in again as a returning user would.
		await page.goto(`${appUrl()}/account`);
		await page.getByRole('button', { name: 'Sign out' }).first().click();
		await page.waitForURL(appUrl() + '/');
		await signIn(page, owner.email, owner.password);
		await expect(page.getByText('confirmed', { exact: true }).count()).resolves.toBe(1);

		await page.goto(`${appUrl()}/organisations/new`);
		await page.getByLabel('Name', { exact: true }).fill('Test Basin Heat Group');
		await page.getByLabel('Short name (in addresses)').fill(slug);
		await page.getByLabel('Country').fill('Nowhere (test)');
		await page.getByRole('button', { name: 'Create organisation' }).click();
		await page.waitForURL(new RegExp(`/organisations/${slug}/settings$`));

		await page.getByLabel('E-mail address').fill(second.email);
		await page.getByLabel('Role', { exact: true }).selectOption('viewer');
		await page.getByRole('button', { name: 'Send invitation' }).click();
		await page.getByText(`Invitation sent to ${second.email}`).waitFor();
		await expect(page.getByTestId('pending-invitations').textContent()).resolves.toContain(
			second.email
		);
		await screenshot(page, 'organisation-invited');

		// The second person opens the invitation signed out, creates an account from there,
		// confirms the address and comes back to the invitation without looking for the mail again.
		const invite = await waitForMail(second.email, 'Invitation to join Test Basin Heat Group');
		const secondContext = await browser.newContext();
		const page2 = await secondContext.newPage();
		await page2.goto(firstLink(invite.text));
		await page2.getByRole('heading', { name: 'You have an invitation' }).waitFor();
		await screenshot(page2, 'invitation-signed-out');
		await page2.getByRole('link', { name: 'Create an account' }).click();
		await page2.waitForURL(/\/sign-up\?next=/);
		await page2.getByText('you come back to your invitation').waitFor();
		await page2.getByLabel('Your name').fill(second.name);
		await page2.getByLabel('E-mail address').fill(second.email);
		await page2.getByLabel('Password', { exact: true }).fill(second.password);
		await page2.getByLabel('Password again').fill(second.password);
		await page2.getByRole('button', { name: 'Create account' }).click();
		await page2.waitForURL(/\/verify-email\?sent=/);
		await verifyFromMail(page2, second);
		// The page that confirmed the address no longer asks to confirm it.
		await expect(
			page2.getByText('Confirm your e-mail address to upload data').count()
		).resolves.toBe(0);
		await page2.getByRole('link', { name: 'Back to your invitation' }).click();
		await page2.waitForURL(/\/invitations\//);
		await expect(page2.locator('main p').first().textContent()).resolves.toMatch(
			/Ola Nordmark invites you to join\s+Test Basin Heat Group\s+as\s+viewer/
		);
		await screenshot(page2, 'invitation-signed-in');
		await page2.getByRole('button', { name: 'Accept' }).click();
		await page2.waitForURL(new RegExp(`/organisations/${slug}$`));
		await expect(page2.getByText('You are viewer here.').count()).resolves.toBe(1);

		// The owner promotes the new member to curator.
		await page.goto(`${appUrl()}/organisations/${slug}/settings`);
		const row = page.locator(`tr[data-email="${second.email}"]`);
		await row.getByLabel(`Role of ${second.name}`).selectOption('curator');
		await row.getByRole('button', { name: 'Change' }).click();
		await page.getByText('Members updated.').waitFor();
		await page2.reload();
		await expect(page2.getByText('You are curator here.').count()).resolves.toBe(1);
		await screenshot(page, 'organisation-members');

		await page.getByRole('button', { name: 'Sign out' }).first().click();
		await page.waitForURL(appUrl() + '/');
		await expect(page.getByRole('link', { name: 'Sign in' }).count()).resolves.toBe(1);
		expect(errors).toEqual([]);
		await ownerContext.close();
		await secondContext.close();
	});

	it('resets a forgotten password through the e-mailed link', async () => {
		const context = await browser.newContext();
		const page = await context.newPage();
		await page.goto(`${appUrl()}/forgot-password`);
		await page.getByLabel('E-mail address').fill(owner.email);
		await page.getByRole('button', { name: 'Send reset link' }).click();
		await page.getByText('a reset link is on its way').waitFor();
		const mail = await waitForMail(owner.email, 'Reset your password');
		await page.goto(firstLink(mail.text));
		await page.getByLabel('New password', { exact: true }).fill('a-fresh-password-9');
		await page.getByLabel('New password again').fill('a-fresh-password-9');
		await page.getByRole('button', { name: 'Change password' }).click();
		await page.waitForURL(/\/sign-in\?reset=1/);
		await page.getByText('Password changed').waitFor();
		await signIn(page, owner.email, 'a-fresh-password-9');
		await screenshot(page, 'account-after-reset');

		// The same link a second time is refused with a way forward.
		await page.goto(firstLink(mail.text));
		await page.getByLabel('New password', { exact: true }).fill('yet-another-password');
		await page.getByLabel('New password again').fill('yet-another-password');
		await page.getByRole('button', { name: 'Change password' }).click();
		await page.getByRole('alert').waitFor();
		await expect(page.getByRole('alert').textContent()).resolves.toMatch(
			/invalid, already used or expired/
		);
		await context.close();
	});
});
