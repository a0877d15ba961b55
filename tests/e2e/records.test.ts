// A tool opened from a build keeps its result in the build: the TDC finder and the degree tape.
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, freshEmail, signUp } from '../support/client';
import { baseUrl, contextFor, launch, screenshots } from './browser';

let browser: Browser;
let client: Client;
let buildId: string;
beforeAll(async () => {
	browser = await launch();
	client = await signUp('records', freshEmail('records'));
	buildId = (await client.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Records from the tools' })).body.id;
});
afterAll(() => browser?.close());

type Overview = {
	tdcRecords: { label: string; tdcDeg: string; params: Record<string, string> }[];
	tapes: { label: string; params: Record<string, string> }[];
};

describe('saving tool results into a build (Chromium)', () => {
	it('keeps a TDC record from the TDC finder, with the TDC half-way between the marks', async () => {
		const page = await (await contextFor(browser, client.cookies)).newPage();
		await page.goto(`${baseUrl}/tdc?build=${buildId}`);
		await page.getByLabel('First mark').fill('-14');
		await page.getByLabel('Second mark').fill('15');
		await page.getByLabel('Label (optional)').fill('hot, after the run');
		// The address keeps the build while the readings go into it.
		await expect.poll(() => new URL(page.url()).searchParams.get('b')).toBe('15');
		expect(new URL(page.url()).searchParams.get('build')).toBe(buildId);
		await page.getByRole('button', { name: 'Save TDC record to the build' }).click();
		await page.getByText('Saved in the build.').waitFor();
		const { body } = await client.json<Overview>(`/api/v1/builds/${buildId}`);
		// Marks 29° apart: TDC 14.5° from each, at 0.5° (common practice); −14 on the signed scale is 14 BTDC.
		expect(body.tdcRecords).toMatchObject([
			{ label: 'hot, after the run', tdcDeg: '0.5', params: { a: '14 BTDC', b: '15 ATDC', scale: 'signed', rotation: 'cw' } }
		]);
		// The build page lists it with its sides.
		await page.setViewportSize({ width: 390, height: 844 });
		await page.goto(`${baseUrl}/builds/${buildId}`);
		await expect
			.poll(() => page.getByTestId('tdc-records').innerText())
			.toMatch(/TDC 0\.5° ATDC of the scale’s 0\s+from marks 14° BTDC and 15° ATDC, signed scale/);
		await page.getByTestId('tdc-records').screenshot({ path: join(screenshots, 'build-tdc-records.png') });
	});

	it('keeps the degree tape printed for the hub', async () => {
		const page = await (await contextFor(browser, client.cookies)).newPage();
		await page.goto(`${baseUrl}/tape?build=${buildId}`);
		await page.getByLabel('Hub diameter (mm)').fill('120');
		await page.getByRole('button', { name: 'Save degree tape to the build' }).click();
		await page.getByText('Saved in the build.').waitFor();
		const { body } = await client.json<Overview>(`/api/v1/builds/${buildId}`);
		expect(body.tapes[0]!.params.diameter).toBe('120');
	});

	it('keeps the engine profile from the phasing check', async () => {
		const page = await (await contextFor(browser, client.cookies)).newPage();
		await page.goto(`${baseUrl}/phasing?build=${buildId}&teeth=36&missing=1&toothAtTdc=9&layout=twin-270`);
		// 36-1 with tooth 9 at TDC: 90° BTDC (geometry, common practice).
		await expect.poll(() => page.getByTestId('first-tooth-offset').innerText()).toMatch(/^90° BTDC/);
		await page.getByRole('button', { name: 'Save engine profile to the build' }).click();
		await page.getByText('Saved in the build.').waitFor();
		const { body } = await client.json<{ build: { engineProfile: Record<string, string> } }>(`/api/v1/builds/${buildId}`);
		expect(body.build.engineProfile).toMatchObject({ teeth: '36', missing: '1', toothAtTdc: '9', layout: 'twin-270' });
	});
});
