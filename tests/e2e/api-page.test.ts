// The API page on a phone, in the dark theme: every route opened at once, nothing reaches past
// the screen's edge (long paths, parameter tables and examples wrap or scroll inside their box).
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, launch, screenshots } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(() => browser?.close());

describe('the API page', () => {
	it('fits a 390 px phone with every route open, in the dark theme', async () => {
		const context = await browser.newContext({
			viewport: { width: 390, height: 844 },
			deviceScaleFactor: 2,
			isMobile: true,
			hasTouch: true
		});
		await context.addCookies([{ name: 'pw-theme', value: 'dark', url: baseUrl }]);
		const page = await context.newPage();
		await page.goto(`${baseUrl}/docs/api`);
		expect(await page.locator('html').getAttribute('data-theme')).toBe('dark');
		const routes = page.locator('details');
		// The document's routes, one each (GET /api/v1/openapi.json has 40 operations at this writing; at least the tools and builds).
		expect(await routes.count()).toBeGreaterThan(30);
		await page.evaluate(() => document.querySelectorAll('details').forEach((d) => (d.open = true)));
		const widths = await page.evaluate(() => {
			const client = document.documentElement.clientWidth;
			const over = [...document.body.querySelectorAll('*')].filter(
				(e) => e.getBoundingClientRect().right > client + 0.5 && !e.closest('pre')
			);
			const innermost = over.filter((e) => !over.some((o) => o !== e && e.contains(o)));
			return { scroll: document.documentElement.scrollWidth, client, named: innermost.slice(0, 3).map((e) => e.outerHTML.slice(0, 120)) };
		});
		expect(widths.scroll, widths.named.join('\n')).toBeLessThanOrEqual(widths.client);
		await page.locator('#getWheel').scrollIntoViewIfNeeded();
		await page.screenshot({ path: join(screenshots, 'api-page-phone-dark.png') });
		// The footer links here.
		await page.goto(`${baseUrl}/`);
		await page.getByRole('contentinfo').getByRole('link', { name: 'API' }).click();
		await page.waitForURL(`${baseUrl}/docs/api`);
		await context.close();
	});
});
