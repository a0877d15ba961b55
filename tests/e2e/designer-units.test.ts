import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, launch, screenshots } from './browser';

// The units radios are drawn as a segmented control (the inputs are sr-only): their labels are clicked.
// A metric shaft on an inch wheel, typed with its unit, and fractions kept through the unit switch.
// 1 in = 25.4 mm exactly (international inch, 1959): a 20 mm bore is a 10 mm radius in the preview,
// which draws in millimetres.

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(() => browser?.close());

/** The radii of the full circles in the preview's cut outline (a circle is drawn as two half arcs). */
async function circleRadii(page: Page): Promise<number[]> {
	const d = (await page.getByTestId('wheel-preview').locator('path[fill-rule="evenodd"]').getAttribute('d')) ?? '';
	return [...d.matchAll(/M[-\d.]+ [-\d.]+A([\d.]+) \1 0 1 0 [-\d.]+ [-\d.]+A\1 \1 0 1 0/g)].map((m) => Number(m[1]));
}

describe('lengths with their own unit in the designer (Chromium)', () => {
	it('takes a 20 mm bore on an inch wheel and keeps 1/8 through two unit switches', async () => {
		const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
		const page = await context.newPage();
		await page.goto(`${baseUrl}/wheel`);
		await expect.poll(() => page.getByTestId('wheel-preview').getAttribute('data-teeth')).toBe('35');
		await page.locator('label:has(#units-in)').click();
		await expect.poll(() => page.getByLabel(/^Bore \(in\)/).count()).toBe(1);

		const bore = page.getByLabel(/^Bore/);
		await bore.fill('20 mm');
		await expect.poll(() => new URL(page.url()).searchParams.get('bore')).toBe('20 mm');
		expect(await bore.getAttribute('aria-invalid')).toBeNull();
		await expect.poll(() => circleRadii(page)).toContain(10);
		await page.screenshot({ path: join(screenshots, 'designer-20mm-bore-on-inch-wheel.png'), fullPage: true });

		const depth = page.getByLabel(/^Tooth depth/);
		await depth.fill('1/8');
		await expect.poll(() => new URL(page.url()).searchParams.get('depth')).toBe('1/8');
		// To mm: 1/8 in = 3.175 mm, shown to 0.01 mm; the bore typed with its unit stays as typed.
		await page.locator('label:has(#units-mm)').click();
		await expect.poll(() => depth.inputValue()).toBe('3.18');
		expect(await bore.inputValue()).toBe('20 mm');
		// And back: the fraction as typed, not 3.18 mm in inches (0.1252).
		await page.locator('label:has(#units-in)').click();
		await expect.poll(() => depth.inputValue()).toBe('1/8');
		expect(await bore.inputValue()).toBe('20 mm');
		await expect.poll(() => circleRadii(page)).toContain(10);
		await context.close();
	});

	it('says why beside the field when the unit comes first', async () => {
		const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
		const page = await context.newPage();
		await page.goto(`${baseUrl}/wheel`);
		const bore = page.getByLabel(/^Bore/);
		await bore.fill('mm 20');
		await expect.poll(() => bore.getAttribute('aria-invalid')).toBe('true');
		await expect.poll(() => page.getByText(/^units go after the number/).count()).toBeGreaterThan(0);
		await context.close();
	});
});
