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

describe('wheel designer in Chromium (signed out)', () => {
	it('redraws the preview as the form changes, and downloads the DXF', async () => {
		const context = await browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
		const page = await context.newPage();
		await page.goto(`${baseUrl}/wheel`);
		const preview = page.getByTestId('wheel-preview');
		await expect.poll(() => preview.getAttribute('data-teeth')).toBe('35');

		// 60-2: the seed of most ECU set-ups (common practice: 58 teeth drawn).
		await page.getByLabel('Teeth (N)').fill('60');
		await page.getByLabel('Missing (M)').fill('2');
		await expect.poll(() => preview.getAttribute('data-teeth')).toBe('58');
		expect(await preview.getAttribute('aria-label')).toMatch(/60-2/);
		// The address follows the design, so the link can be shared.
		await expect.poll(() => new URL(page.url()).searchParams.get('teeth')).toBe('60');
		await page.screenshot({ path: join(screenshots, 'designer-60-2.png'), fullPage: true });

		// An impossible wheel is refused beside the field, and nothing can be downloaded.
		await page.getByLabel('Missing (M)').fill('60');
		await expect.poll(() => page.getByText(/at most 59/).count()).toBeGreaterThan(0);
		await page.getByLabel('Missing (M)').fill('2');

		const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download DXF' }).click()]);
		expect(download.suggestedFilename()).toBe('wheel-60-2-100mm.dxf');
		const file = join(screenshots, '..', download.suggestedFilename());
		await download.saveAs(file);
		// Read back by ezdxf: a clean audit (see tests/support/dxf_facts.py for the full checks).
		const facts = JSON.parse(
			execFileSync('/usr/bin/python3', [join(import.meta.dirname, '..', 'support', 'dxf_facts.py'), file, '100'], { encoding: 'utf8' })
		);
		expect(facts).toMatchObject({ auditErrors: 0, openEnds: 0, tipArcs: 58, insunits: 4 });
		await context.close();
	});
});
