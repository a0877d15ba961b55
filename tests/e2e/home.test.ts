import { join } from 'node:path';
import { existsSync } from 'node:fs';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, launch, screenshots } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(() => browser?.close());

describe('home page in Chromium', () => {
	it('says what Phasewright does, switches the theme, and is saved as screenshots', async () => {
		const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, colorScheme: 'light' });
		const page = await context.newPage();
		const response = await page.goto(baseUrl);
		expect(response?.status()).toBe(200);
		await expect.poll(() => page.locator('h1').innerText()).toContain('Phasewright');

		const html = page.locator('html');
		const background = () => page.evaluate(() => getComputedStyle(document.documentElement).backgroundColor);
		expect(await html.getAttribute('data-theme')).toBe('system');
		const systemLight = await background();
		await page.screenshot({ path: join(screenshots, 'home-light.png'), fullPage: true });

		// system -> light -> dark
		const toggle = page.getByTestId('theme-switch');
		await toggle.click();
		expect(await html.getAttribute('data-theme')).toBe('light');
		expect(await background()).toBe(systemLight);
		await toggle.click();
		expect(await html.getAttribute('data-theme')).toBe('dark');
		const dark = await background();
		expect(dark).not.toBe(systemLight);
		await page.screenshot({ path: join(screenshots, 'home-dark.png'), fullPage: true });

		// The choice is kept in a cookie, so the server renders it on the next visit.
		await page.reload();
		expect(await html.getAttribute('data-theme')).toBe('dark');
		expect(await background()).toBe(dark);

		expect(existsSync(join(screenshots, 'home-light.png'))).toBe(true);
		expect(existsSync(join(screenshots, 'home-dark.png'))).toBe(true);
		await context.close();
	});

	it('keeps every control a 44 px touch target on a phone', async () => {
		const context = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
		const page = await context.newPage();
		await page.goto(baseUrl);
		const small = await page.evaluate(() =>
			[...document.querySelectorAll<HTMLElement>('button, a[href], input, select, summary')]
				// Links inside running text are exempt (WCAG 2.2, 2.5.8 "inline"), as are visually hidden ones.
				.filter((el) => el.offsetParent !== null && !el.closest('p') && el.getBoundingClientRect().width > 1)
				.map((el) => ({ text: el.innerText.trim() || el.getAttribute('aria-label'), h: el.getBoundingClientRect().height }))
				.filter((c) => c.h < 44)
		);
		expect(small).toEqual([]);
		await page.screenshot({ path: join(screenshots, 'home-phone.png'), fullPage: true });
		await context.close();
	});
});
