// Pages a garage can live with, in real Chromium: the photo stays put under the finger while taps,
// refusals and readings come and go; "Start over" can be undone; long names never widen a page;
// the revision comparison speaks in labels and units.
import { join } from 'node:path';
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { syntheticWheelPhoto, type SyntheticWheelPhoto } from '$support/synthetic-photos';
import { Client, freshEmail, signUp } from '../support/client';
import { baseUrl, launch, screenshots } from './browser';

let browser: Browser;
let shot: SyntheticWheelPhoto;
beforeAll(async () => {
	browser = await launch();
	// The photo the photo e2e reads as 36-1 (tests/e2e/photos.test.ts).
	shot = await syntheticWheelPhoto({
		teeth: 36,
		missing: 1,
		width: 1600,
		height: 1200,
		rotationDeg: 37,
		noise: 4,
		blur: 1,
		tips: 3,
		seed: 11
	});
});
afterAll(() => browser?.close());

const phone = { viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, isMobile: true, hasTouch: true };
const desktop = { viewport: { width: 1280, height: 900 } };

async function signedIn(client: Client, options: Parameters<Browser['newContext']>[0]): Promise<BrowserContext> {
	const context = await browser.newContext(options);
	await context.addCookies([...client.cookies].map(([name, value]) => ({ name, value, url: baseUrl })));
	return context;
}

async function uploadPhoto(client: Client, buildId: string, name: string): Promise<string> {
	const form = new FormData();
	form.append('file', new Blob([new Uint8Array(shot.image)], { type: 'image/jpeg' }), name);
	const res = await client.send<{ photos: { id: string }[] }>('POST', `/api/v1/builds/${buildId}/photos`, form);
	expect(res.status).toBe(201);
	return res.body.photos[0]!.id;
}

const squash = (s: string) => s.replace(/\s+/g, ' ').trim();

/** Where the photo sits on the page (not on the screen: a scroll is not a move). */
const photoBox = (page: Page) =>
	page.getByTestId('photo-taps').evaluate((el) => {
		const r = el.getBoundingClientRect();
		return { x: r.x + window.scrollX, y: r.y + window.scrollY, width: r.width, height: r.height };
	});

async function tapAt(page: Page, how: 'mouse' | 'touch', p: { x: number; y: number }) {
	const overlay = page.getByTestId('photo-taps');
	await overlay.scrollIntoViewIfNeeded();
	const box = (await overlay.boundingBox())!;
	const at = { x: box.x + (p.x * box.width) / shot.width, y: box.y + (p.y * box.height) / shot.height };
	if (how === 'mouse') await page.mouse.click(at.x, at.y);
	else await page.touchscreen.tap(at.x, at.y);
}

/** Drags a tapped point (a press on one picks it; it does not add a tip). */
async function dragFrom(page: Page, from: { x: number; y: number }, to: { x: number; y: number }) {
	const box = (await page.getByTestId('photo-taps').boundingBox())!;
	const screen = (p: { x: number; y: number }) => ({
		x: box.x + (p.x * box.width) / shot.width,
		y: box.y + (p.y * box.height) / shot.height
	});
	const [a, b] = [screen(from), screen(to)];
	await page.mouse.move(a.x, a.y);
	await page.mouse.down();
	await page.mouse.move(b.x, b.y, { steps: 8 });
	await page.mouse.up();
}

async function press(button: Locator, how: 'mouse' | 'touch') {
	if (how === 'mouse') await button.click();
	else await button.tap();
}

describe('steady pages in Chromium', () => {
	let client: Client;
	let buildId: string;
	beforeAll(async () => {
		client = await signUp('Steady Tester', freshEmail('e2e-steady'));
		const created = await client.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Steady single' });
		expect(created.status).toBe(201);
		buildId = created.body.id;
	});

	for (const [size, options, how] of [
		['phone', phone, 'touch'],
		['desktop', desktop, 'mouse']
	] as const) {
		it(`keeps the photo where it is through taps, a refusal, Start again and its undo, and a reading (${size})`, async () => {
			const photoId = await uploadPhoto(client, buildId, `steady-${size}.jpg`);
			const context = await signedIn(client, options);
			const page = await context.newPage();
			await page.goto(`${baseUrl}/builds/${buildId}/photos/${photoId}`);
			await expect.poll(() => page.getByTestId('photo-taps').isVisible()).toBe(true);
			const start = await photoBox(page);
			expect(start.width).toBeGreaterThan(100);
			const boxes: { when: string; box: typeof start }[] = [];
			const record = async (when: string) => boxes.push({ when, box: await photoBox(page) });
			const step = () => page.getByTestId('reader-step').innerText();
			const taps = page.getByTestId('photo-taps');

			expect(await step()).toMatch(/centre/i);
			await tapAt(page, how, shot.taps.centre);
			await expect.poll(() => taps.getAttribute('data-centre')).not.toBe('');
			await record('centre tapped');
			expect(await step()).toMatch(/tip/i);
			// A "tip" right by the centre: the API's own check refuses it (too near the centre). A press on a
			// tapped point picks it, so the tip is tapped on the rim and dragged there.
			await tapAt(page, how, shot.taps.tips[0]!);
			await expect.poll(() => taps.getAttribute('data-tips')).toBe('1');
			await dragFrom(page, shot.taps.tips[0]!, { x: shot.taps.centre.x + 3, y: shot.taps.centre.y + 3 });
			await record('a tip tapped');
			expect(await step()).toMatch(/read the teeth/i);
			await press(page.getByRole('button', { name: 'Read the teeth' }), how);
			await expect.poll(() => page.getByRole('alert').filter({ hasText: 'Tooth tips:' }).count()).toBe(1);
			await record('refused');
			// After a refusal: what to do next.
			expect(await step()).toMatch(/undo/i);

			// Start again, then its undo puts the taps back; nothing moves for the notice either.
			await press(page.getByRole('button', { name: 'Start again' }), how);
			expect(await taps.getAttribute('data-tips')).toBe('0');
			const notice = page.getByTestId('undo-notice');
			await expect.poll(() => notice.count()).toBe(1);
			await record('started again');
			await press(notice.getByRole('button', { name: 'Undo' }), how);
			await expect.poll(() => taps.getAttribute('data-tips')).toBe('1');
			expect(await notice.count()).toBe(0);
			await record('start again undone');
			await press(page.getByRole('button', { name: 'Start again' }), how);
			await expect.poll(() => taps.getAttribute('data-tips')).toBe('0');

			await tapAt(page, how, shot.taps.centre);
			for (const [i, tip] of shot.taps.tips.entries()) {
				await tapAt(page, how, tip);
				await expect.poll(() => taps.getAttribute('data-tips')).toBe(String(i + 1));
				await record(`tip ${i + 1}`);
			}
			// The next tap was the one that cleared the offer to undo.
			expect(await notice.count()).toBe(0);
			await page.getByLabel('Outside diameter').fill('100');
			await press(page.getByRole('button', { name: 'Read the teeth' }), how);
			await expect.poll(() => page.getByTestId('reading-pattern').count(), { timeout: 20_000 }).toBe(1);
			await record('read');
			// After a reading: what it found (the synthetic wheel is a 36-1, drawn from our own SVG export).
			expect(await step()).toMatch(/36-1/);

			for (const { when, box } of boxes) {
				expect(Math.abs(box.x - start.x), `x after ${when}`).toBeLessThanOrEqual(0.5);
				expect(Math.abs(box.y - start.y), `y after ${when}`).toBeLessThanOrEqual(0.5);
				expect(Math.abs(box.width - start.width), `width after ${when}`).toBeLessThanOrEqual(0.5);
				expect(Math.abs(box.height - start.height), `height after ${when}`).toBeLessThanOrEqual(0.5);
			}
			await page.screenshot({ path: join(screenshots, `steady-photo-${size}.png`), fullPage: true });
			await context.close();
		});
	}

	it('undoes Start over in the wheel designer and the phasing check', async () => {
		const context = await browser.newContext(desktop);
		const page = await context.newPage();

		await page.goto(`${baseUrl}/wheel`);
		const teeth = page.getByLabel('Teeth (N)', { exact: true });
		const first = await teeth.inputValue();
		const mine = first === '60' ? '48' : '60';
		await teeth.fill(mine);
		await page.getByRole('button', { name: 'Start over' }).click();
		await expect.poll(() => teeth.inputValue()).toBe(first);
		const notice = page.getByTestId('undo-notice');
		await notice.getByRole('button', { name: 'Undo' }).click();
		await expect.poll(() => teeth.inputValue()).toBe(mine);
		expect(await notice.count()).toBe(0);
		// A change after Start over ends the offer: nothing to undo into by surprise later.
		await page.getByRole('button', { name: 'Start over' }).click();
		await expect.poll(() => notice.count()).toBe(1);
		await teeth.fill('12');
		await expect.poll(() => notice.count()).toBe(0);

		await page.goto(`${baseUrl}/phasing`);
		const tooth = page.getByLabel('Tooth at the sensor at TDC');
		const example = await tooth.inputValue();
		const typed = example === '9' ? '10' : '9';
		await tooth.fill(typed);
		await page.getByRole('button', { name: 'Start over' }).click();
		await expect.poll(() => tooth.inputValue()).toBe(example);
		await page.getByTestId('undo-notice').getByRole('button', { name: 'Undo' }).click();
		await expect.poll(() => tooth.inputValue()).toBe(typed);
		await context.close();
	});

	it('never lets a long name widen a page on a phone', async () => {
		// No spaces anywhere: nothing for the browser to break at. Lengths at each field's limit.
		const name = 'N'.repeat(80);
		const email = `${'e'.repeat(40)}${Date.now().toString(36)}@${'d'.repeat(60)}.${'s'.repeat(60)}.example.test`;
		expect(email.length).toBeGreaterThan(180);
		const owner = await signUp(name, email);
		const build = await owner.send<{ id: string }>('POST', '/api/v1/builds', { name: 'B'.repeat(120), engine: 'E'.repeat(300) });
		expect(build.status).toBe(201);
		const id = build.body.id;
		const design = await owner.send<{ id: string }>('POST', `/api/v1/builds/${id}/designs`, {
			name: 'D'.repeat(80),
			params: { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', thickness: '3' },
			message: 'M'.repeat(300)
		});
		expect(design.status).toBe(201);
		const photoId = await uploadPhoto(owner, id, `${'P'.repeat(116)}.jpg`);

		const context = await signedIn(owner, phone);
		const page = await context.newPage();
		const pages = [
			'/builds',
			`/builds/${id}`,
			`/builds/${id}/designs/${design.body.id}`,
			`/builds/${id}/photos/${photoId}`,
			'/workshop',
			'/account'
		];
		for (const path of pages) {
			await page.goto(`${baseUrl}${path}`);
			const widths = await page.evaluate(() => {
				const client = document.documentElement.clientWidth;
				// What reaches past the edge, to say what to fix when this fails: the innermost elements, and
				// the elements holding text that spills out of its box (the box itself may fit).
				const over = [...document.body.querySelectorAll('*')].filter((e) => e.getBoundingClientRect().right > client + 0.5);
				const innermost = over.filter((e) => !over.some((o) => o !== e && e.contains(o)));
				const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
				const range = document.createRange();
				for (let node = walker.nextNode(); node; node = walker.nextNode()) {
					range.selectNodeContents(node);
					if (range.getBoundingClientRect().right > client + 0.5 && node.parentElement) innermost.push(node.parentElement);
				}
				const named = innermost.slice(0, 3).map((e) => `<${e.tagName.toLowerCase()} class="${e.getAttribute('class') ?? ''}">`);
				return { scroll: document.documentElement.scrollWidth, client, named };
			});
			expect(widths.scroll, `${path} is ${widths.scroll} px wide in ${widths.client} px: ${widths.named.join(', ')}`).toBeLessThanOrEqual(
				widths.client
			);
		}
		await page.goto(`${baseUrl}/builds/${id}`);
		await page.screenshot({ path: join(screenshots, 'steady-long-names-build.png'), fullPage: true });
		// A truncated name keeps the whole of it in its title.
		expect(await page.getByRole('navigation', { name: 'Breadcrumb' }).getByTitle('B'.repeat(120)).count()).toBe(1);
		await context.close();
	});

	it('compares revisions by label, with units, choice words and what an empty value means', async () => {
		const base = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', thickness: '3' };
		const design = await client.send<{ id: string }>('POST', `/api/v1/builds/${buildId}/designs`, { name: 'Words', params: base });
		expect(design.status).toBe(201);
		const designId = design.body.id;
		const second = await client.send('POST', `/api/v1/designs/${designId}/revisions`, {
			baseRevision: 1,
			params: { ...base, tipRadius: '0.5', keyway: 'din6885', shaft: '20', keywayAngle: '45', thickness: '4' },
			message: 'Rounded tips, a DIN key'
		});
		expect(second.status).toBe(201);

		const context = await signedIn(client, phone);
		const page = await context.newPage();
		await page.goto(`${baseUrl}/builds/${buildId}/designs/${designId}`);
		const row = (name: string) => page.locator(`[data-testid="param-changes"] tr[data-param="${name}"]`);
		await expect.poll(async () => squash(await row('tipRadius').innerText())).toBe('Tip corner radius 0 (sharp) → 0.5 mm');
		// The designer's labels, the key standard's name as the form offers it, degrees and millimetres (typed here).
		expect(squash(await row('keyway').innerText())).toBe('Keyway None → DIN 6885-1 parallel key');
		expect(squash(await row('keywayAngle').innerText())).toBe('Keyway angle not used → 45°');
		expect(squash(await row('thickness').innerText())).toBe('Thickness 3 mm → 4 mm');
		expect(await page.getByTestId('param-changes').innerText()).not.toMatch(/tipRadius|keywayAngle|not given/);
		await page.screenshot({ path: join(screenshots, 'steady-revision-words-phone.png'), fullPage: true });
		await context.close();
	});
});
