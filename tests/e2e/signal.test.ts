import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freshEmail, signUp } from '../support/client';
import { baseUrl, contextFor, launch, screenshots } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(() => browser?.close());

const marginOf = async (page: import('playwright-core').Page, id: string) =>
	(await page.getByTestId(`case-${id}`).getByTestId('case-margin').innerText()).trim();

// Steady cranking on a 36-1 read by its leading edges: by geometry (common practice) the gap is
// 2.0× the space before and an ordinary space 1.0×, so with the detection ratio at 1.5 the margin is
// 2 / 1.5 − 1 = 1 − 1 / 1.5 = 33 %. A swing per compression event can only take from that (a space
// in the slow part of the cycle grows against the one before it), never add to it.
const steadyCranking = 'teeth=36&missing=1&toothAtTdc=9&layout=single-4&ratio=1.5&cranking=250&crankingSwing=0&crankingAccel=0';

describe('signal check in Chromium (signed out)', () => {
	it('answers each case, and a swing of the crank speed changes the cranking margin', async () => {
		const page = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
		await page.goto(`${baseUrl}/signal?${steadyCranking}`);
		await expect.poll(() => marginOf(page, 'cranking')).toBe('33%');
		expect(await page.getByTestId('case-cranking').getByTestId('case-verdict').innerText()).toMatch(/^safe/);
		expect(await page.getByTestId('spaces-chart').getAttribute('role')).toBe('img');

		await page.locator('#signal-crankingSwing').fill('40');
		await expect.poll(async () => Number((await marginOf(page, 'cranking')).replace('%', ''))).toBeLessThan(33);
		// The address follows, so a link shares the check.
		await expect.poll(() => new URL(page.url()).searchParams.get('crankingSwing')).toBe('40');
		await page.screenshot({ path: join(screenshots, 'signal.png'), fullPage: true });
	});

	it('names a bad ratio beside its field', async () => {
		const page = await (await browser.newContext({ viewport: { width: 390, height: 844 } })).newPage();
		await page.goto(`${baseUrl}/signal?${steadyCranking}`);
		await page.locator('#signal-ratio').fill('0');
		await expect.poll(() => page.locator('#signal-ratio-error').isVisible()).toBe(true);
		expect(await page.getByTestId('no-answer').isVisible()).toBe(true);
	});
});

describe('signal check saved from a build', () => {
	it('keeps the check in the build and shows its margins on the build page', async () => {
		const me = await signUp('Signal saver', freshEmail('e2e-signal'));
		const build = await me.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Signal e2e single', engine: '' });
		expect(build.status).toBe(201);
		const buildId = build.body.id;
		const wheel = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' };
		expect((await me.send('POST', `/api/v1/builds/${buildId}/designs`, { name: 'Crank wheel', params: wheel })).status).toBe(201);
		expect(
			(
				await me.send('PUT', `/api/v1/builds/${buildId}/engine`, {
					params: { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'single-4' }
				})
			).status
		).toBeLessThan(300);

		const context = await contextFor(browser, me.cookies, { viewport: { width: 1280, height: 900 } });
		const page = await context.newPage();
		await page.goto(`${baseUrl}/builds/${buildId}`);
		await page.getByRole('link', { name: 'Check the signal for this build' }).click();
		await page.waitForURL(/\/signal\?/);
		expect(new URL(page.url()).searchParams.get('build')).toBe(buildId);
		await page.locator('#signal-ratio').fill('1.5');
		await page.locator('#signal-cranking').fill('250');
		await page.locator('#signal-crankingSwing').fill('0');
		await page.locator('#signal-crankingAccel').fill('0');
		await expect.poll(() => marginOf(page, 'cranking')).toBe('33%');
		await page.getByRole('button', { name: 'Save signal check to the build' }).click();
		await page.getByText('Saved in the build.').waitFor();

		await page.goto(`${baseUrl}/builds/${buildId}`);
		const section = page.getByTestId('signal-checks');
		await expect.poll(() => section.innerText()).toMatch(/Cranking at 250 rpm\s*safe, 33%/);
		await page.screenshot({ path: join(screenshots, 'signal-in-build.png'), fullPage: true });
	});
});
