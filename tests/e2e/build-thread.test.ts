import { execFileSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freshEmail, signUp, type Client } from '../support/client';
import { baseUrl, contextFor, launch, screenshots } from './browser';

// The thread through a fresh build, in Chromium, going only by the build page's own step links:
// describe the engine, design the wheel, send a cutting package, find TDC, keep a degree tape,
// issue the build sheet (read back with pdftotext); then a new wheel revision marks what rested on
// the old one stale, and the phasing check opened from the stale step carries the new wheel.
// The rules for each step's state are in src/lib/build-steps.ts.
//
// Other pages change their labels; fields here are found by their public parameter names
// (`[name="teeth"]`), which the registries keep, and buttons and links by role.

let browser: Browser;
let owner: Client;
let context: BrowserContext;

beforeAll(async () => {
	browser = await launch();
	owner = await signUp('Tess Thread', freshEmail('e2e-thread'));
	context = await contextFor(browser, owner.cookies);
});
afterAll(() => browser?.close());

const viewports = [
	{ name: 'desktop', width: 1280, height: 900 },
	{ name: 'phone', width: 390, height: 844 }
] as const;

const steps = (page: Page) => page.getByTestId('build-steps');
const stepOf = (page: Page, id: string) => steps(page).locator(`[data-step="${id}"]`);
const stateOf = (page: Page, id: string) => stepOf(page, id).getAttribute('data-state');
const allStates = (page: Page) =>
	steps(page)
		.locator('[data-step]')
		.evaluateAll((items) => Object.fromEntries(items.map((li) => [li.getAttribute('data-step'), li.getAttribute('data-state')])));
const field = (page: Page, name: string) => page.locator(`[name="${name}"]`).first();
const saved = (page: Page) => page.getByRole('status').filter({ hasText: 'Saved in the build.' });

describe.each(viewports)('the thread through a build in Chromium, $name', (viewport) => {
	let page: Page;
	let buildId = '';
	const shot = (n: number, what: string) =>
		page.screenshot({ path: join(screenshots, `build-thread-${viewport.name}-${n}-${what}.png`), fullPage: true });

	/** Back on the build's page, as a builder would come back to it. */
	async function backToBuild() {
		await page.goto(`${baseUrl}/builds/${buildId}`);
		await expect.poll(() => steps(page).count()).toBe(1);
	}

	/** Follows a step's own link. */
	async function follow(step: string, action: string) {
		await stepOf(page, step).getByRole('link', { name: action }).click();
	}

	beforeAll(async () => {
		const created = await owner.send<{ id: string }>('POST', '/api/v1/builds', {
			name: `Thread ${viewport.name} 350 single`,
			engine: '344 cc single, 4-stroke'
		});
		expect(created.status).toBe(201);
		buildId = created.body.id;
		page = await context.newPage();
		await page.setViewportSize({ width: viewport.width, height: viewport.height });
	});
	afterAll(() => page?.close());

	it('starts with every step to do', async () => {
		await backToBuild();
		expect(await allStates(page)).toEqual({
			engine: 'todo',
			wheel: 'todo',
			cutting: 'todo',
			tdc: 'todo',
			tape: 'todo',
			phasing: 'todo',
			sheet: 'todo'
		});
		// Nothing to send and no sheet to print before there is a wheel.
		expect(await stepOf(page, 'cutting').getByRole('link').count()).toBe(0);
		expect(await stepOf(page, 'sheet').getByRole('link').count()).toBe(0);
		await shot(1, 'fresh');
	});

	it('describes the engine in the phasing check and saves the profile back', async () => {
		await follow('engine', 'Describe the engine');
		await page.waitForURL(/\/phasing\?/);
		expect(new URL(page.url()).searchParams.get('build')).toBe(buildId);
		// A four-stroke single with a 36-1 (the page's example), tooth 9 under the sensor at TDC.
		await field(page, 'toothAtTdc').fill('9');
		// 9 teeth of 10° before the gap's first tooth: 90° BTDC (geometry: 360° / 36 per position).
		await expect.poll(() => page.getByTestId('first-tooth-offset').innerText()).toMatch(/90\s*°\s*BTDC/);
		await page.getByRole('button', { name: 'Save engine profile to the build' }).click();
		await expect.poll(() => saved(page).count()).toBe(1);

		await backToBuild();
		expect(await stateOf(page, 'engine')).toBe('done');
		// No wheel yet to check against.
		expect(await stateOf(page, 'phasing')).toBe('todo');
	});

	it('designs the wheel from the profile’s pattern and saves it to the build', async () => {
		await follow('wheel', 'Design the wheel');
		await page.waitForURL(/\/wheel\?/);
		expect(new URL(page.url()).searchParams.get('build')).toBe(buildId);
		await expect.poll(() => field(page, 'teeth').inputValue()).toBe('36');
		expect(await field(page, 'missing').inputValue()).toBe('1');
		// 36 positions, one left out: 35 teeth drawn (common practice).
		await expect.poll(() => page.getByTestId('wheel-preview').getAttribute('data-teeth')).toBe('35');
		await field(page, 'od').fill('100');
		await page.getByLabel('Design name').fill('Crank wheel');
		await page.getByLabel('Revision message').fill('First cut');
		await page.getByRole('button', { name: 'Save to build' }).click();
		await expect.poll(() => page.getByText(/Saved as revision 1 of/).count()).toBe(1);

		await backToBuild();
		expect(await stateOf(page, 'wheel')).toBe('done');
		// The profile was saved at 36-1 and the wheel is 36-1: phasing is checked.
		expect(await stateOf(page, 'phasing')).toBe('done');
		expect(await stepOf(page, 'wheel').getByRole('link').getAttribute('href')).toMatch(/^\/wheel\?design=[0-9a-f-]{36}$/);
	});

	it('sends a cutting package from the step’s own link', async () => {
		await follow('cutting', 'Send a cutting package');
		const fabricator = freshEmail('e2e-thread-fab');
		const form = page.locator('form').filter({ has: page.locator('[name="to"]') });
		await form.locator('[name="to"]').fill(fabricator);
		await form.locator('[name="quantity"]').fill('1');
		await form.getByRole('button', { name: /send/i }).click();
		await expect.poll(() => page.getByTestId('cutting-packages').innerText(), { timeout: 20_000 }).toContain(fabricator);
		await expect.poll(() => stateOf(page, 'cutting')).toBe('done');
	});

	it('finds TDC in the TDC finder and keeps the record in the build', async () => {
		await follow('tdc', 'Find TDC');
		await page.waitForURL(/\/tdc\?/);
		expect(new URL(page.url()).searchParams.get('build')).toBe(buildId);
		await field(page, 'a').fill('-14');
		await field(page, 'b').fill('15');
		// Half-way between 14° BTDC and 15° ATDC: 0.5° ATDC (common practice: piston stop).
		await expect.poll(() => page.getByTestId('tdc-result').innerText()).toBe('0.5° ATDC');
		await page.getByRole('button', { name: 'Save TDC record to the build' }).click();
		await expect.poll(() => saved(page).count()).toBe(1);

		await backToBuild();
		expect(await stateOf(page, 'tdc')).toBe('done');
		expect(await stepOf(page, 'tdc').innerText()).toContain('0.5° ATDC');
	});

	it('makes a degree tape for the timing hub and keeps it in the build', async () => {
		await follow('tape', 'Make a degree tape');
		await page.waitForURL(/\/tape\?/);
		expect(new URL(page.url()).searchParams.get('build')).toBe(buildId);
		// The timing-light card is headed with the build's name.
		expect(await page.locator('#card-name').inputValue()).toBe(`Thread ${viewport.name} 350 single`);
		await field(page, 'diameter').fill('127');
		await expect.poll(() => page.getByTestId('tape-preview').count()).toBe(1);
		await page.getByRole('button', { name: 'Save degree tape to the build' }).click();
		await expect.poll(() => saved(page).count()).toBe(1);

		await backToBuild();
		expect(await stateOf(page, 'tape')).toBe('done');
		// The next tape starts at this hub.
		expect(await stepOf(page, 'tape').getByRole('link').getAttribute('href')).toBe(
			`/tape?build=${buildId}&units=mm&diameter=127&name=Thread+${viewport.name}+350+single`
		);
		expect(await allStates(page)).toMatchObject({
			engine: 'done',
			wheel: 'done',
			cutting: 'done',
			tdc: 'done',
			tape: 'done',
			phasing: 'done',
			sheet: 'todo'
		});
		await shot(2, 'before-sheet');
	});

	it('issues the build sheet: the download is logged, the step turns done, and the PDF carries the build', async () => {
		const [download] = await Promise.all([page.waitForEvent('download'), follow('sheet', 'Download the build sheet')]);
		const file = join(mkdtempSync(join(tmpdir(), 'thread-sheet-')), 'sheet.pdf');
		await download.saveAs(file);
		await expect.poll(() => stateOf(page, 'sheet'), { timeout: 15_000 }).toBe('done');
		expect(await stepOf(page, 'sheet').innerText()).toContain('wheel revision 1 of “Crank wheel”');
		await expect.poll(() => page.getByTestId('activity-log').innerText()).toContain('Build sheet issued');

		const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
		expect(text).toContain(`Thread ${viewport.name} 350 single`);
		// 36-1: 35 teeth present (common practice).
		expect(text).toMatch(/36-1/);
		expect(text).toMatch(/35 teeth/);
		// The TDC record with its sides, and the tape's hub.
		expect(text).toMatch(/14\s*°\s*BTDC and 15\s*°\s*ATDC/);
		expect(text).toMatch(/0\.5\s*°\s*ATDC/);
		expect(text).toMatch(/hub 127(\.0+)?\s*mm/);
		await shot(3, 'issued');
	});

	it('marks phasing, the cutting package and the sheet stale after a new wheel revision, saying what changed', async () => {
		await follow('wheel', 'Open in the designer');
		await page.waitForURL(/\/wheel\?design=/);
		await expect.poll(() => field(page, 'teeth').inputValue()).toBe('36');
		await field(page, 'teeth').fill('24');
		await field(page, 'missing').fill('2');
		// 24 positions, two left out: 22 teeth drawn (common practice).
		await expect.poll(() => page.getByTestId('wheel-preview').getAttribute('data-teeth')).toBe('22');
		await page.getByLabel('Revision message').fill('24-2 for the new ECU');
		await page.getByRole('button', { name: 'Save revision' }).click();
		await expect.poll(() => page.getByText(/Saved as revision 2 of/).count()).toBe(1);

		await backToBuild();
		expect(await allStates(page)).toMatchObject({
			wheel: 'done',
			tdc: 'done',
			tape: 'done',
			phasing: 'stale',
			cutting: 'stale',
			sheet: 'stale'
		});
		expect(await stepOf(page, 'phasing').getByTestId('step-changes').innerText()).toMatch(/teeth 36 → 24\s+missing 1 → 2/);
		expect(await stepOf(page, 'cutting').getByTestId('step-changes').innerText()).toContain('sent for revision 1');
		expect(await stepOf(page, 'sheet').getByTestId('step-changes').innerText()).toContain('wheel revision 2 saved');
		await shot(4, 'stale');
	});

	it('opens the phasing check from the stale step at the new 24-2 wheel, and saving it makes phasing done again', async () => {
		await follow('phasing', 'Check phasing');
		await page.waitForURL(/\/phasing\?/);
		const query = new URL(page.url()).searchParams;
		expect([query.get('build'), query.get('design')]).toEqual([buildId, expect.stringMatching(/^[0-9a-f-]{36}$/)]);
		// The reported bug: a 24-2 build opened the check at 36-1.
		expect(await field(page, 'teeth').inputValue()).toBe('24');
		expect(await field(page, 'missing').inputValue()).toBe('2');
		expect(await field(page, 'toothAtTdc').inputValue()).toBe('9');
		// 9 positions of 15° (360° / 24): 135° BTDC (geometry).
		await expect.poll(() => page.getByTestId('first-tooth-offset').innerText()).toMatch(/135\s*°\s*BTDC/);
		await page.getByRole('button', { name: 'Save engine profile to the build' }).click();
		await expect.poll(() => saved(page).count()).toBe(1);

		await backToBuild();
		expect(await stateOf(page, 'phasing')).toBe('done');
		// The engine profile's own link carries the wheel too.
		const profileLink = page.locator('section[aria-labelledby="engine-title"]').getByRole('link', { name: 'Open in the phasing check' });
		const href = new URL((await profileLink.getAttribute('href'))!, baseUrl).searchParams;
		expect([href.get('teeth'), href.get('missing')]).toEqual(['24', '2']);
		await shot(5, 'phasing-again');
	});
});
