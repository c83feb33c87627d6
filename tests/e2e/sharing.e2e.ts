import { eq } from 'drizzle-orm';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { dataset, site, user } from '../../src/lib/server/db/schema';
import { appUrl, launch, screenshot, signedIn } from './browser';
import { firstLink, waitForMail } from './mail';

const CURATOR = 'curator@korvald-survey.example';
const OUTSIDER = 'owner@skarnholt.example';
const databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl)
	throw new Error('DATABASE_URL is not set: run the browser tests through `npm test`');
const { db, client: sql } = createDb(databaseUrl, { max: 1 });

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser?.close();
	await sql.end();
});

/** A fresh browser context signed in as a demo account. */
describe('access to a restricted dataset, as an outsider and a curator would do it', () => {
	it('request with a purpose, approval read from the mail, then the values are open', async () => {
		// A published restricted dataset of the curator's organisation (its publication is
		// review.e2e.ts's subject), with one site of a recognisable code and value.
		const title = `Restricted survey (e2e ${Date.now()})`;
		const code = `RS-${Date.now().toString(36)}`;
		const [creator] = await db
			.select({ id: user.id })
			.from(user)
			.where(eq(user.email, 'contributor@korvald-survey.example'));
		const [d] = await db
			.insert(dataset)
			.values({
				organisationId: 'org-korvald-survey',
				title,
				abstract: 'Borehole heat flow of a restricted survey block.',
				licence: 'CC-BY-4.0',
				status: 'published',
				visibility: 'restricted',
				createdBy: creator.id
			})
			.returning({ id: dataset.id });
		await db.insert(site).values({
			datasetId: d.id,
			code,
			location: { lon: 9.87, lat: 62.13 },
			heatFlowMWm2: 88.76
		});

		// The outsider follows a link to the dataset: only its summary, and a form to ask.
		const outsider = await signedIn(browser, OUTSIDER);
		const o = outsider.page;
		await o.goto(`${appUrl()}/datasets/${d.id}`);
		await o.waitForURL(/\/about$/);
		await o.getByRole('heading', { name: title }).waitFor();
		await expect(o.getByText(code).count()).resolves.toBe(0);
		await o
			.getByLabel('What do you want to use the data for?')
			.fill('A compilation of Caledonian heat flow for a regional model.');
		await o.getByRole('button', { name: 'Ask for access' }).click();
		await o.getByText('Your request has been sent. The curators have been told.').waitFor();
		await screenshot(o, 'sharing-requested');

		// The curator reads the request in the mail, follows its link and approves.
		const asked = await waitForMail(CURATOR, `Access requested to "${title}"`);
		expect(asked.text).toContain('Caledonian heat flow');
		const curator = await signedIn(browser, CURATOR);
		const k = curator.page;
		await k.goto(firstLink(asked.text));
		await expect(k.getByTestId('access-requests').textContent()).resolves.toContain(
			'Caledonian heat flow'
		);
		await screenshot(k, 'sharing-queue');
		await k.getByRole('button', { name: 'Approve' }).click();
		await k.getByText(/^Approved: .* now has access and has been told\.$/).waitFor();
		await expect(k.getByTestId('access-grants').textContent()).resolves.toContain(OUTSIDER);

		// The outsider is told by mail and now sees the sites with their values.
		const granted = await waitForMail(OUTSIDER, `Access granted to "${title}"`);
		await o.goto(firstLink(granted.text));
		await o.waitForURL(new RegExp(`/datasets/${d.id}$`));
		const table = o.getByTestId('sites-table');
		await expect(table.textContent()).resolves.toContain(code);
		await expect(table.textContent()).resolves.toContain('88.8');
		await screenshot(o, 'sharing-granted');

		expect(outsider.errors).toEqual([]);
		expect(curator.errors).toEqual([]);
	});
});
