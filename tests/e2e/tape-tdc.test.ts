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
		await page.getByLabel('First mark').fill('-10');
		await page.getByLabel('Second mark').fill('19');
		// Seed document: marks 29° apart put TDC 14.5° from each; here TDC reads 4.5.
		await expect.poll(() => page.getByTestId('tdc-result').innerText()).toMatch(/4\.5/);
		await expect.poll(() => new URL(page.url()).searchParams.get('b')).toBe('19');
		await page.screenshot({ path: join(screenshots, 'tdc.png'), fullPage: true });
	});

	it('takes readings as a degree wheel shows them, says what to do, and refuses a quadrant wheel typed as plain numbers', async () => {
		const page = await (await browser.newContext({ viewport: { width: 390, height: 844 } })).newPage();
		await page.goto(`${baseUrl}/tdc`);
		await page.getByLabel('First mark').fill('10 BTDC');
		await page.getByLabel('Second mark').fill('19 ATDC');
		// Seed document: 29° apart, 14.5° each side: −10 + 14.5 = 4.5° ATDC (by hand).
		await expect.poll(() => page.getByTestId('tdc-result').innerText()).toBe('4.5° ATDC');
		expect(await page.getByTestId('tdc-half').innerText()).toBe('14.5°');
		await page.getByLabel('Rim diameter under the scale (mm), optional').fill('76.2');
		// s = π·D·θ/360 = π·76.2·4.5/360 = 2.992 mm (by hand). Clockwise crank: the tape moves toward its
		// right past the pointer (3D rim model, src/lib/trade/hub.test.ts), so the 4.5 ATDC graduation,
		// under the pointer at true TDC, trails 0 on its left.
		await expect.poll(() => page.getByTestId('tdc-remark').innerText()).toMatch(/2\.99 mm along the rim.*to the left of it on a tape/);
		expect(await page.getByTestId('tdc-pointer').innerText()).toMatch(
			/the way the crank turns, over the old 0 \(clockwise seen from the wheel side\)/
		);
		// The drawing, seen from the wheel side (clockwise crank: BTDC clockwise of 0, ahead of it): with
		// TDC under the pointer at 12 o'clock, the 10 BTDC stop lies right of the top and 19 ATDC left.
		const x = async (id: string) => Number(await page.getByTestId(id).getAttribute('x'));
		expect(await page.getByTestId('tdc-diagram-a').textContent()).toBe('1st 10° BTDC');
		expect(await x('tdc-diagram-a')).toBeGreaterThan(0);
		expect(await x('tdc-diagram-b')).toBeLessThan(0);
		await page.screenshot({ path: join(screenshots, 'tdc-phone.png'), fullPage: true });

		await page.getByLabel('First mark').fill('10');
		await page.getByLabel('Second mark').fill('19');
		await expect.poll(() => page.getByTestId('tdc-result').innerText()).toBe('—');
		await expect.poll(() => page.locator('#tdc-b-error').innerText()).toMatch(/Both readings lie ATDC of 0.*10 BTDC and 19 ATDC/);
		await page.getByLabel('Scale on your wheel or tape').selectOption('quadrant');
		await expect
			.poll(() => page.locator('#tdc-a-error').innerText())
			.toMatch(/on a 0–90–0 wheel.*like 10 BTDC, 19 ATDC, 30 BBDC or 30 ABDC/);
		await page.getByLabel('First mark').fill('10 BTDC');
		await page.getByLabel('Second mark').fill('19 ATDC');
		await expect.poll(() => page.getByTestId('tdc-result').innerText()).toBe('4.5° ATDC');
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

	it('cuts the round degree wheel’s centre hole to the shaft typed, and refuses one wider than the ring of marks allows', async () => {
		const context = await browser.newContext();
		const page = await context.newPage();
		await page.goto(`${baseUrl}/tape`);
		await page.getByLabel('Hub diameter (mm)').fill('150');
		const disc = page.getByRole('link', { name: 'Download degree wheel PDF (disc)' });
		await expect.poll(() => disc.getAttribute('href')).toMatch(/diameter=150/);
		expect(await disc.getAttribute('href')).not.toMatch(/shaft=/);
		const shaft = page.getByLabel('Shaft diameter (mm)');
		await shaft.fill('25');
		await expect.poll(() => disc.getAttribute('href')).toMatch(/[?&]shaft=25(&|$)/);
		// A hole as wide as the disc cannot leave the marks whole: the field says so and the link waits.
		await shaft.fill('140');
		await expect.poll(() => disc.getAttribute('aria-disabled')).toBe('true');
		expect(await shaft.getAttribute('aria-invalid')).toBe('true');
		await context.close();
	});
});
