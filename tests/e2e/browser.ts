// Real Chromium (Debian's) driven by playwright-core. Screenshots go to test-results/screenshots/.
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type Browser } from 'playwright-core';

export const baseUrl = process.env.APP_URL ?? '';
export const screenshots = join(import.meta.dirname, '..', '..', 'test-results', 'screenshots');

export async function launch(): Promise<Browser> {
	if (!baseUrl) throw new Error('End-to-end tests need APP_URL: run them with `npm test`.');
	mkdirSync(screenshots, { recursive: true });
	return chromium.launch({
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
