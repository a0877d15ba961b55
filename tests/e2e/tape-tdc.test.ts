import { execFileSync } from 'node:child_process';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, launch, screenshots } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(() => browser?.close());

describe('TDC finder and degree tape in Chromium (signed out)', () => {
	it('reads true TDC from two piston-stop marks', async () => {
		const page = await (await browser.newContext()).newPage();
		await page.goto(`${baseUrl}/tdc`);
		await page.getByLabel('First mark (°)').fill('-10');
		await page.getByLabel('Second mark (°)').fill('19');
		// Seed document: marks 29° apart put TDC 14.5° from each; here TDC reads 4.5.
		await expect.poll(() => page.getByTestId('tdc-result').innerText()).toMatch(/4\.5/);
		await expect.poll(() => new URL(page.url()).searchParams.get('b')).toBe('19');
		await page.screenshot({ path: join(screenshots, 'tdc.png'), fullPage: true });
	});

	it('draws a tape for a hub and downloads its PDF', async () => {
		const context = await browser.newContext({ acceptDownloads: true });
		const page = await context.newPage();
		await page.goto(`${baseUrl}/tape`);
		await page.getByLabel('Hub diameter (mm)').fill('76.2');
		await expect.poll(() => page.getByTestId('tape-preview').count()).toBe(1);
		await page.screenshot({ path: join(screenshots, 'tape.png'), fullPage: true });
		const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download tape PDF' }).click()]);
		const file = join(screenshots, '..', download.suggestedFilename());
		await download.saveAs(file);
		expect(download.suggestedFilename()).toMatch(/^degree-tape-76\.2mm-(a4|letter)\.pdf$/);
		expect(execFileSync('pdfinfo', [file], { encoding: 'utf8' })).toMatch(/Pages:\s+1/);
		await context.close();
	});
});
