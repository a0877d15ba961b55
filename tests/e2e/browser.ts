// Real Chromium (Debian's) driven by playwright-core. Screenshots go to test-results/screenshots/.
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const baseUrl = process.env.APP_URL ?? '';
export const screenshots = join(import.meta.dirname, '..', '..', 'test-results', 'screenshots');

export async function launch(): Promise<Browser> {
	if (!baseUrl) throw new Error('End-to-end tests need APP_URL: run them with `npm test`.');
	mkdirSync(screenshots, { recursive: true });
	const browser = await chromium.launch({
		executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
		args: [
			'--headless',
			'--no-sandbox',
			'--disable-gpu',
			'--disable-quic',
			'--no-first-run',
			'--disable-background-networking',
			'--disable-component-update',
			'--disable-sync'
		]
	});
	const newContext = browser.newContext.bind(browser);
	browser.newContext = async (...args) => waitsForHydration(await newContext(...args));
	return browser;
}

/**
 * A page opened with `goto` answers typing only once the app has hydrated (the root layout marks
 * `<html data-hydrated>`): a field filled before that is reset by hydration, so every HTML page's
 * `goto` here waits for the mark.
 */
function waitsForHydration(context: BrowserContext): BrowserContext {
	const patch = (page: Page) => {
		const goto = page.goto.bind(page);
		page.goto = async (...args) => {
			const response = await goto(...args);
			if (response?.headers()['content-type']?.startsWith('text/html') && response.ok())
				await page.locator('html[data-hydrated]').waitFor({ state: 'attached' });
			return response;
		};
		return page;
	};
	const newPage = context.newPage.bind(context);
	context.newPage = async () => patch(await newPage());
	return context;
}

/** A browser context carrying the session of a client signed in through the API (tests/support/client.ts). */
export async function contextFor(browser: Browser, cookies: Map<string, string>, options: Parameters<Browser['newContext']>[0] = {}) {
	const context = await browser.newContext(options);
	const url = new URL(baseUrl);
	await context.addCookies(
		[...cookies].map(([name, value]) => ({ name, value, domain: url.hostname, path: '/', httpOnly: true, sameSite: 'Lax' as const }))
	);
	return context;
}
