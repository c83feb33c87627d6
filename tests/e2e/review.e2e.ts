import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appUrl, launch, screenshot, signedIn } from './browser';
import { waitForMail } from './mail';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser?.close();
});

const CONTRIBUTOR = 'contributor@korvald-survey.example';
const CURATOR = 'curator@korvald-survey.example';

/** A fresh browser context signed in as a demo account. */
const status = (page: Page) => page.getByTestId('dataset-status').textContent();

describe('review, as a contributor and a curator would do it', () => {
	it('submit, return with a comment read from the mail, resubmit, publish', async () => {
		const contributor = await signedIn(browser, CONTRIBUTOR);
		const c = contributor.page;
		const title = `Review round trip (e2e ${Date.now()})`;
		await c.goto(`${appUrl()}/datasets/new`);
		await c
			.getByLabel('Organisation', { exact: true })
			.selectOption({ label: 'Korvald Geological Survey' });
		await c.getByLabel('Title', { exact: true }).fill(title);
		await c.getByLabel('Licence', { exact: true }).selectOption('CC-BY-4.0');
		await c.getByRole('button', { name: 'Create draft' }).click();
		await c.waitForURL(/\/datasets\/[0-9a-f-]{36}$/);
		const datasetUrl = c.url();
		await expect(status(c)).resolves.toBe('Draft');
		await expect(c.getByTestId('dataset-audience').textContent()).resolves.toBe(
			'Not published: only members of the organisation can see it.'
		);

		await c.getByRole('button', { name: 'Submit for review' }).click();
		await c.getByText('Submitted for review. The curators have been told.').waitFor();
		await expect(status(c)).resolves.toBe('In review');
		await screenshot(c, 'review-submitted');

		// The curator hears of it by mail and follows the link.
		const notice = await waitForMail(CURATOR, `"${title}" was submitted`);
		expect(notice.text).toContain(datasetUrl);
		const curator = await signedIn(browser, CURATOR);
		const k = curator.page;
		await k.goto(datasetUrl);
		const comment = 'Add the uncertainty of every heat-flow value, then submit again.';
		await k.getByLabel('What needs to change before it can be published').fill(comment);
		await k.getByRole('button', { name: 'Return to the contributors' }).click();
		await k.getByText('Returned to the contributors with your comment.').waitFor();
		await expect(status(k)).resolves.toBe('Returned for changes');

		// The contributor reads the comment in the mail and on the page, and submits again.
		const returned = await waitForMail(CONTRIBUTOR, `"${title}" was returned`);
		expect(returned.text).toContain(comment);
		await c.goto(datasetUrl);
		await expect(c.getByTestId('return-comment').textContent()).resolves.toBe(comment);
		await screenshot(c, 'review-returned');
		await c.getByRole('button', { name: 'Submit for review' }).click();
		await c.getByText('Submitted for review. The curators have been told.').waitFor();

		await k.goto(datasetUrl);
		await k.getByRole('button', { name: 'Publish' }).click();
		await k.getByText('Published.', { exact: true }).waitFor();
		await expect(status(k)).resolves.toBe('Published');
		await expect(k.getByTestId('dataset-history').textContent()).resolves.toContain('published it');
		await screenshot(k, 'review-published');
		await waitForMail(CONTRIBUTOR, `"${title}" was published`);

		expect(contributor.errors).toEqual([]);
		expect(curator.errors).toEqual([]);
	});
});
