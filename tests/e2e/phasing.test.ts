import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, launch, screenshots } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(() => browser?.close());

describe('phasing check in Chromium (signed out)', () => {
	it('gives the first-tooth offset and draws the diagram', async () => {
		const page = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
		await page.goto(`${baseUrl}/phasing`);
		await page.getByLabel('Tooth at the sensor at TDC').fill('9');
		// Worked example (common practice): 36-1 with tooth 9 at TDC -> 90° BTDC.
		await expect.poll(() => page.getByTestId('first-tooth-offset').innerText()).toMatch(/90\s*° BTDC/);
		expect(await page.getByTestId('phasing-diagram').getAttribute('role')).toBe('img');
		await page.screenshot({ path: join(screenshots, 'phasing.png'), fullPage: true });
	});
});
