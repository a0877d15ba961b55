// A build's page shows the newest 20 of a list; "Older …" opens the next ones and "Newest …" goes
// back (issue 20). Records are saved through the API one after another, so their order is the
// order they were sent in: the oracle.
import type { Browser, BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freshEmail, signUp, type Client } from '../support/client';
import { baseUrl, contextFor, launch } from './browser';

let browser: Browser;
let context: BrowserContext;
let owner: Client;
let buildId: string;
const label = (i: number) => `Stop ${String(i).padStart(2, '0')}`;

beforeAll(async () => {
	browser = await launch();
	owner = await signUp('Paging Bench', freshEmail('e2e-paging'));
	buildId = (await owner.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Twenty-five stops' })).body.id;
	for (let i = 1; i <= 25; i++) {
		const res = await owner.send('POST', `/api/v1/builds/${buildId}/tdc-records`, {
			label: label(i),
			params: { a: '10 BTDC', b: '10 ATDC' }
		});
		expect(res.status).toBe(201);
	}
	context = await contextFor(browser, owner.cookies);
});
afterAll(() => browser?.close());

describe('a build with 25 TDC records', () => {
	it('shows the newest 20, and "Older TDC records" shows the other 5, then "Newest" the first 20 again', async () => {
		const page = await context.newPage();
		await page.goto(`${baseUrl}/builds/${buildId}`);
		const records = page.getByTestId('tdc-records');
		const text = await records.innerText();
		for (let i = 6; i <= 25; i++) expect(text).toContain(label(i));
		for (let i = 1; i <= 5; i++) expect(text).not.toContain(label(i));

		await page.getByRole('link', { name: 'Older TDC records' }).click();
		await expect.poll(() => page.url()).toContain('tdcRecords=');
		await expect.poll(() => records.innerText()).toContain(label(1));
		const older = await records.innerText();
		for (let i = 1; i <= 5; i++) expect(older).toContain(label(i));
		expect(older).not.toContain(label(6));
		expect(await page.getByRole('link', { name: 'Older TDC records' }).count()).toBe(0);

		await page.getByRole('link', { name: 'Newest TDC records' }).click();
		await expect.poll(() => records.innerText()).toContain(label(25));
		expect(page.url()).not.toContain('tdcRecords=');
	});

	it('reaches the oldest activity entry (the build made) through "Older activity"', async () => {
		const page = await context.newPage();
		await page.goto(`${baseUrl}/builds/${buildId}`);
		const log = page.getByTestId('activity-log');
		expect(await log.getByRole('listitem').count()).toBe(20);
		await page.getByRole('link', { name: 'Older activity' }).click();
		await expect.poll(() => log.innerText()).toContain('Twenty-five stops');
		expect(await log.getByRole('listitem').count()).toBe(6);
	});
});
