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
