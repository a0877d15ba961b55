// The photo reading page of issue 17 in Chromium: tapped points dragged (mouse, touch) and nudged
// (arrow keys) to correct them, the teeth read again on release; and what is drawn over the photo.
// The dragging runs against the real reading API. The drawing tests route the reading call in the
// browser (playwright page.route) to fixed answers in the shape agreed for issue 17 (ellipse,
// teethAt, unseen, confidenceWord; advice and ellipse on a refusal), which today's reader does not
// give yet: they test the page's drawing only, not the reading.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { syntheticWheelPhoto, type SyntheticWheelPhoto } from '$support/synthetic-photos';
import { Client, freshEmail, signUp } from '../support/client';
import { baseUrl, contextFor, launch, screenshots } from './browser';

let browser: Browser;
let owner: Client;
let shot: SyntheticWheelPhoto;
const ids = { build: '', photo: '' };
const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

beforeAll(async () => {
	browser = await launch();
	owner = await signUp('Photo Page Tester', freshEmail('e2e-photo-page'));
	const build = await owner.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Twin, 60-2 crank wheel' });
	expect(build.status).toBe(201);
	ids.build = build.body.id;
	// A 60-2 wheel drawn from the project's own SVG export, turned, a little noisy.
	shot = await syntheticWheelPhoto({
		teeth: 60,
		missing: 2,
		width: 1600,
		height: 1200,
		rotationDeg: 23,
		noise: 3,
		blur: 1,
		tips: 3,
		seed: 7
	});
	const form = new FormData();
	form.append('file', new Blob([new Uint8Array(shot.image)], { type: 'image/jpeg' }), 'wheel-60-2.jpg');
	const up = await owner.send<{ photos: { id: string }[] }>('POST', `/api/v1/builds/${ids.build}/photos`, form);
	expect(up.status).toBe(201);
	ids.photo = up.body.photos[0]!.id;
}, 120_000);
afterAll(() => browser?.close());

const pageUrl = () => `${baseUrl}/builds/${ids.build}/photos/${ids.photo}`;
const desktop = { viewport: { width: 1280, height: 900 } };
const phone = { viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, isMobile: true, hasTouch: true };

async function opened(options: Parameters<Browser['newContext']>[0]): Promise<{ context: BrowserContext; page: Page }> {
	const context = await contextFor(browser, owner.cookies, options);
	const page = await context.newPage();
	await page.goto(pageUrl());
	return { context, page };
}

/** Image px to the page's px, from where the overlay is drawn. */
async function onScreen(page: Page, p: { x: number; y: number }) {
	const box = (await page.getByTestId('photo-taps').boundingBox())!;
	return { x: box.x + (p.x * box.width) / shot.width, y: box.y + (p.y * box.height) / shot.height, scale: box.width / shot.width };
}

/** Where the page holds a tapped point (image px), from its handle. */
async function heldAt(handle: Locator) {
	const [x, y] = (await handle.getAttribute('data-at'))!.split(',').map(Number);
	return { x: x!, y: y! };
}

async function middleOf(el: Locator) {
	const b = (await el.boundingBox())!;
	return { x: b.x + b.width / 2, y: b.y + b.height / 2, width: b.width, height: b.height };
}

/** Counts the reading requests the page sends. */
function readingCalls(page: Page) {
	const calls = { n: 0 };
	page.on('request', (r) => {
		if (r.method() === 'POST' && /\/api\/v1\/photos\/[^/]+\/reading$/.test(r.url())) calls.n++;
	});
	return calls;
}

/** Clears the taps (and a stored reading's) when there are any. */
async function startAgain(page: Page) {
	const button = page.getByRole('button', { name: 'Start again' });
	if (await button.isEnabled()) await button.click();
	expect(await page.getByTestId('photo-taps').getAttribute('data-tips')).toBe('0');
}

async function tapTaps(page: Page, points: { x: number; y: number }[]) {
	await page.getByTestId('photo-taps').scrollIntoViewIfNeeded();
	for (const p of points) {
		const at = await onScreen(page, p);
		await page.mouse.click(at.x, at.y);
	}
}

describe('the photo reading page: correcting taps', () => {
	it('a tip dragged with the mouse moves by the drag and is read again on release; a still press only picks it', async () => {
		const { context, page } = await opened(desktop);
		const calls = readingCalls(page);
		await startAgain(page);
		await tapTaps(page, [shot.taps.centre, ...shot.taps.tips]);
		expect(await page.getByTestId('photo-taps').getAttribute('data-tips')).toBe('3');
		// Before any reading, a drag corrects the tap but reads nothing: the user is still tapping.
		const handles = page.getByTestId('tap-handle');
		expect(await handles.count()).toBe(4);
		const tip = handles.nth(1);
		const start = await heldAt(tip);
		const m = await middleOf(tip);
		// Every handle is a 44 px touch target (WCAG 2.5.5, the project's min-h-tap).
		expect(Math.min(m.width, m.height)).toBeGreaterThanOrEqual(44);
		await page.mouse.move(m.x, m.y);
		await page.mouse.down();
		await page.mouse.move(m.x + 20, m.y - 10, { steps: 4 });
		await page.mouse.move(m.x + 40, m.y - 20, { steps: 4 });
		await page.mouse.up();
		const { scale } = await onScreen(page, start);
		const moved = await heldAt(tip);
		// 40 and -20 screen px at the photo's scale (image px per screen px is 1 / scale), to the 0.1 px the page keeps.
		expect(moved.x - start.x).toBeCloseTo(40 / scale, 0);
		expect(moved.y - start.y).toBeCloseTo(-20 / scale, 0);
		expect(calls.n).toBe(0);
		expect(await page.getByTestId('photo-taps').getAttribute('data-tips')).toBe('3');

		// Dragged back and read: from then on a drag reads again by itself.
		const back = await middleOf(tip);
		await page.mouse.move(back.x, back.y);
		await page.mouse.down();
		await page.mouse.move(back.x - 40, back.y + 20, { steps: 6 });
		await page.mouse.up();
		await page.getByRole('button', { name: 'Read the teeth' }).click();
		await expect.poll(() => page.getByTestId('reading-pattern').count(), { timeout: 20_000 }).toBe(1);
		expect(await page.getByTestId('reading-pattern').innerText()).toBe(`${shot.truth.teeth}-${shot.truth.missing}`);
		expect(calls.n).toBe(1);

		const again = await middleOf(tip);
		await page.mouse.move(again.x, again.y);
		await page.mouse.down();
		await page.mouse.move(again.x + 3, again.y + 12, { steps: 4 });
		// While dragged, the answer shows as out of date.
		expect(await page.getByTestId('reading-answer').innerText()).toMatch(/taps have changed/);
		await page.mouse.up();
		await expect.poll(() => calls.n, { timeout: 10_000 }).toBe(2);
		await expect.poll(() => page.getByTestId('reading-answer').innerText(), { timeout: 20_000 }).not.toMatch(/taps have changed/);

		// A press that does not move picks the point for the keys and adds no tip on top of it.
		const still = await middleOf(handles.nth(0));
		await page.mouse.click(still.x, still.y);
		expect(await page.getByTestId('photo-taps').getAttribute('data-tips')).toBe('3');
		expect(await handles.nth(0).evaluate((el) => el === document.activeElement)).toBe(true);
		expect(calls.n).toBe(2);
		await context.close();
	}, 90_000);

	it('the focused point moves one screen px per arrow key, ten with Shift, and is read once the keys rest', async () => {
		const { context, page } = await opened(desktop);
		const calls = readingCalls(page);
		// The stored reading of the test before is on the page: a corrected tap reads again.
		expect(await page.getByTestId('reading-pattern').count()).toBe(1);
		const centre = page.getByTestId('tap-handle').first();
		expect(await centre.getAttribute('data-which')).toBe('centre');
		await centre.focus();
		const before = await heldAt(centre);
		const { scale } = await onScreen(page, before);
		await page.keyboard.press('ArrowRight');
		await page.keyboard.press('ArrowRight');
		await page.keyboard.press('Shift+ArrowUp');
		const after = await heldAt(centre);
		expect(after.x - before.x).toBeCloseTo(2 / scale, 0);
		expect(after.y - before.y).toBeCloseTo(-10 / scale, 0);
		// The keys did not scroll the page, and focus stayed on the point.
		expect(await centre.evaluate((el) => el === document.activeElement)).toBe(true);
		// One reading for the three presses, after they rest (600 ms).
		await expect.poll(() => calls.n, { timeout: 10_000 }).toBe(1);
		await page.waitForTimeout(1_000);
		expect(calls.n).toBe(1);
		await expect.poll(() => page.getByTestId('reading-answer').innerText(), { timeout: 20_000 }).not.toMatch(/taps have changed/);
		await context.close();
	}, 60_000);

	it('on a phone a finger drags a tip (the page does not scroll instead) and it is read again', async () => {
		const { context, page } = await opened(phone);
		const calls = readingCalls(page);
		const tip = page.getByTestId('tap-handle').nth(2);
		await tip.scrollIntoViewIfNeeded();
		const m = await middleOf(tip);
		expect(Math.min(m.width, m.height)).toBeGreaterThanOrEqual(44);
		const start = await heldAt(tip);
		const { scale } = await onScreen(page, start);
		const scrolled = await page.evaluate(() => window.scrollY);
		// Playwright's touchscreen only taps: the drag goes in through the DevTools protocol.
		const cdp = await context.newCDPSession(page);
		await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: [{ x: m.x, y: m.y }] });
		for (let i = 1; i <= 6; i++)
			await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: [{ x: m.x - 3 * i, y: m.y + 5 * i }] });
		// Held away from the rim, the tip has followed the finger ...
		const moved = await heldAt(tip);
		// Within one touch step of the finger's 18 px left and 30 px down: the first move may be taken as
		// the drag's start rather than carried over.
		expect(Math.abs(moved.x - start.x + 18 / scale)).toBeLessThanOrEqual(3 / scale + 0.5);
		expect(Math.abs(moved.y - start.y - 30 / scale)).toBeLessThanOrEqual(5 / scale + 0.5);
		// ... and brought back before letting go, so the reading (of a tip on the rim again) can succeed.
		for (let i = 5; i >= 0; i--)
			await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: [{ x: m.x - 3 * i, y: m.y + 5 * i }] });
		await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
		const back = await heldAt(tip);
		expect(Math.hypot(back.x - start.x, back.y - start.y)).toBeLessThan(0.2);
		expect(await page.evaluate(() => window.scrollY)).toBe(scrolled);
		await expect.poll(() => calls.n, { timeout: 10_000 }).toBe(1);
		await expect.poll(() => page.getByTestId('reading-answer').innerText(), { timeout: 20_000 }).not.toMatch(/taps have changed/);
		await context.close();
	}, 60_000);
});

// A 60-2 wheel seen tilted: the tip ellipse and the teeth on it, numbered from the first after the
// gap, counter-clockwise (y up); the teeth from 200° to 250° hidden under a bracket.
const ellipse = { cx: 800, cy: 600, a: 500, b: 400, angleDeg: 20 };
const unseen = { fromDeg: 200, toDeg: 250 };
/** The textbook parametric ellipse (y up), then y flipped: the fixture's own model, not the page's code. */
const onEllipse = (t: number) => {
	const phi = (ellipse.angleDeg * Math.PI) / 180;
	const x = ellipse.a * Math.cos(t) * Math.cos(phi) - ellipse.b * Math.sin(t) * Math.sin(phi);
	const y = ellipse.a * Math.cos(t) * Math.sin(phi) + ellipse.b * Math.sin(t) * Math.cos(phi);
	return { x: ellipse.cx + x, y: ellipse.cy - y };
};
const imageAngle = (p: { x: number; y: number }) => ((Math.atan2(-(p.y - ellipse.cy), p.x - ellipse.cx) * 180) / Math.PI + 360) % 360;
const allTeeth = Array.from({ length: 58 }, (_, i) => ({ n: i + 1, ...onEllipse(((i + 2.5) * 2 * Math.PI) / 60) }));
const teethAt = allTeeth.filter((t) => {
	const deg = imageAngle(t);
	return deg < unseen.fromDeg || deg > unseen.toDeg;
});
const fixedReading = {
	reading: {
		teeth: 60,
		missing: 2,
		gaps: [{ first: 58, count: 2 }],
		// The gap's middle: between positions 0 and 1 of the 60, one pitch round.
		gapAngleDeg: imageAngle(onEllipse((2 * Math.PI) / 60)),
		pitchDeg: 6,
		duty: 0.5,
		confidence: 0.74,
		toothCount: teethAt.length,
		radiusPx: 450,
		ellipse,
		teethAt,
		unseen: [unseen],
		confidenceWord: 'medium'
	},
	design: { units: 'mm', teeth: '60', missing: '2', duty: '0.5' },
	stored: false
};
const fixedRefusal = {
	message: 'The photo could not be read.',
	code: 'invalid',
	errors: { image: 'image: no ring of teeth was found round the tapped centre' },
	refusals: [{ field: 'image', message: 'no ring of teeth was found round the tapped centre' }],
	advice: ['Tap two or three more tips, spread round the wheel.', 'Shoot square-on to the wheel.', 'Put more light on the rim.'],
	ellipse: { cx: 760, cy: 640, a: 610, b: 380, angleDeg: -35 }
};

/** The ellipse's screen box from the textbook half-widths: sqrt(a² cos² φ + b² sin² φ) across, the same with sin and cos swapped down. */
function expectedBox(e: typeof ellipse, box: { x: number; y: number; width: number }) {
	const phi = (e.angleDeg * Math.PI) / 180;
	const hw = Math.sqrt((e.a * Math.cos(phi)) ** 2 + (e.b * Math.sin(phi)) ** 2);
	const hh = Math.sqrt((e.a * Math.sin(phi)) ** 2 + (e.b * Math.cos(phi)) ** 2);
	const s = box.width / shot.width;
	return { left: box.x + (e.cx - hw) * s, right: box.x + (e.cx + hw) * s, top: box.y + (e.cy - hh) * s, bottom: box.y + (e.cy + hh) * s };
}

async function expectLinedUp(page: Page, drawn: Locator, e: typeof ellipse) {
	const box = (await page.getByTestId('photo-taps').boundingBox())!;
	const want = expectedBox(e, box);
	const got = await drawn.evaluate((el) => {
		const r = el.getBoundingClientRect();
		return { left: r.left, right: r.right, top: r.top, bottom: r.bottom };
	});
	// Both in the viewport's px (Playwright's boundingBox is too); within 1.5 px of the textbook box.
	for (const side of ['left', 'right', 'top', 'bottom'] as const) expect(Math.abs(got[side] - want[side]), side).toBeLessThan(1.5);
}

/** Serious and critical axe findings on the page as it is now. */
async function axeSerious(page: Page): Promise<string[]> {
	await page.addScriptTag({ content: axeSource });
	return page.evaluate(async () => {
		type V = { id: string; impact: string; nodes: { target: string[] }[] };
		const axe = (window as unknown as { axe: { run: (ctx: Document) => Promise<{ violations: V[] }> } }).axe;
		const result = await axe.run(document);
		return result.violations
			.filter((v) => v.impact === 'serious' || v.impact === 'critical')
			.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(' | ')}`);
	});
}

async function withFixedAnswer(options: Parameters<Browser['newContext']>[0], answer: { status: number; body: unknown }) {
	const context = await contextFor(browser, owner.cookies, { ...options, bypassCSP: true });
	const page = await context.newPage();
	await page.route('**/api/v1/photos/*/reading', (route) =>
		route.fulfill({ status: answer.status, contentType: 'application/json', body: JSON.stringify(answer.body) })
	);
	await page.goto(pageUrl());
	await startAgain(page);
	await tapTaps(page, [{ x: 800, y: 600 }, onEllipse(1)]);
	await page.getByRole('button', { name: 'Read the teeth' }).click();
	return { context, page };
}

/** Whether any two of the boxes overlap. */
const overlapping = (boxes: { x: number; y: number; width: number; height: number }[]) =>
	boxes.some((p, i) =>
		boxes.slice(i + 1).some((q) => p.x < q.x + q.width && q.x < p.x + p.width && p.y < q.y + q.height && q.y < p.y + p.height)
	);

describe('the photo reading page: what is drawn over the photo (answers routed to the agreed shape)', () => {
	it('draws the teeth found, numbered every tooth on a desktop and every 5th plus tooth 1 on a phone, never overlapping', async () => {
		const seen = teethAt.map((t) => t.n);
		expect(seen.length).toBeLessThan(58);
		for (const [options, theme, want] of [
			// 1600 px shown about 800 px wide: the closest teeth (at the long axis' ends, where the rim runs at b) are 2π·400/60 ≈ 42
			// image px, about 21 screen px apart: less than the 24 px the page keeps, so every 5th (every tooth when there is
			// room is in the unit tests: overlay-geometry.test.ts).
			[desktop, 'light', seen.filter((n) => n === 1 || n % 5 === 0)],
			// About 350 px wide: those 42 image px are 9 screen px; every 5th (about 45 px) has room.
			[phone, 'dark', seen.filter((n) => n === 1 || n % 5 === 0)]
		] as const) {
			const { context, page } = await withFixedAnswer({ ...options, colorScheme: theme }, { status: 200, body: fixedReading });
			await expect.poll(() => page.getByTestId('tooth-label').count(), { timeout: 10_000 }).toBeGreaterThan(0);
			const labels = page.getByTestId('tooth-label');
			const numbers = (await labels.evaluateAll((els) => els.map((el) => Number(el.getAttribute('data-n'))))).sort((p, q) => p - q);
			expect(numbers).toEqual([...want]);
			for (const el of await labels.all()) expect(await el.textContent()).toBe(await el.getAttribute('data-n'));
			expect(overlapping(await Promise.all((await labels.all()).map(async (l) => (await l.boundingBox())!)))).toBe(false);
			// Each tooth's dot sits where the answer put it.
			const dots = page.getByTestId('teeth-found').locator('circle');
			expect(await dots.count()).toBe(teethAt.length);
			const box = (await page.getByTestId('photo-taps').boundingBox())!;
			const s = box.width / shot.width;
			for (const i of [0, 17, teethAt.length - 1]) {
				const dot = await middleOf(dots.nth(i));
				expect(Math.abs(dot.x - (box.x + teethAt[i]!.x * s))).toBeLessThan(1);
				expect(Math.abs(dot.y - (box.y + teethAt[i]!.y * s))).toBeLessThan(1);
			}
			await expectLinedUp(page, page.getByTestId('found-rim'), ellipse);
			expect(await page.getByTestId('found-gap').count()).toBe(1);
			expect(await page.getByTestId('unseen').count()).toBe(1);
			expect(await page.getByTestId('unseen').textContent()).toBe('not seen');
			expect(await page.getByTestId('reading-confidence').innerText()).toMatch(/^medium \(74 %\)$/);
			expect(await page.getByTestId('reading-unseen').innerText()).toMatch(/^50° of the rim, in 1 stretch/);
			expect(await page.getByTestId('photo-taps').getAttribute('aria-label')).toMatch(
				new RegExp(`${teethAt.length} teeth numbered .* 1 stretch of rim not seen`)
			);
			expect(await axeSerious(page)).toEqual([]);
			await page.getByTestId('photo-taps').scrollIntoViewIfNeeded();
			await page.screenshot({ path: join(screenshots, `photo-reading-teeth-${theme}.png`) });
			await context.close();
		}
	}, 90_000);

	it('after a refusal: the refusal, the advice as a list, and the fitted ellipse over the photo, lined up at any size', async () => {
		for (const [options, theme] of [
			[desktop, 'dark'],
			[phone, 'light']
		] as const) {
			const { context, page } = await withFixedAnswer({ ...options, colorScheme: theme }, { status: 400, body: fixedRefusal });
			await expect.poll(() => page.getByTestId('reading-advice').count(), { timeout: 10_000 }).toBe(1);
			expect(await page.getByRole('alert').filter({ hasText: 'no ring of teeth' }).count()).toBe(1);
			expect(await page.getByTestId('reading-advice').getByRole('listitem').allInnerTexts()).toEqual(fixedRefusal.advice);
			expect(await page.getByTestId('fit-tried').count()).toBe(1);
			await expectLinedUp(page, page.getByTestId('fit-tried').locator('path').first(), fixedRefusal.ellipse);
			expect(await page.getByTestId('teeth-found').count()).toBe(0);
			expect(await axeSerious(page)).toEqual([]);
			await page.getByTestId('photo-taps').scrollIntoViewIfNeeded();
			await page.screenshot({ path: join(screenshots, `photo-reading-refused-${theme}.png`), fullPage: true });
			await context.close();
		}
	}, 90_000);

	it('a reading without the new fields (today’s reader) still draws its tip circle and gap', async () => {
		const { ellipse: _e, teethAt: _t, unseen: _u, confidenceWord: _w, ...older } = fixedReading.reading;
		const { context, page } = await withFixedAnswer(desktop, { status: 200, body: { ...fixedReading, reading: older } });
		await expect.poll(() => page.getByTestId('found-gap').count(), { timeout: 10_000 }).toBe(1);
		expect(await page.getByTestId('tooth-label').count()).toBe(0);
		expect(await page.getByTestId('unseen').count()).toBe(0);
		// The circle of radiusPx about the tapped centre (800, 600).
		await expectLinedUp(page, page.getByTestId('found-rim'), { cx: 800, cy: 600, a: 450, b: 450, angleDeg: 0 });
		// 0.74 in words from the number, as before issue 17 (0.6 to 0.8 is the middle band).
		expect(await page.getByTestId('reading-confidence').innerText()).toMatch(/^medium/);
		await context.close();
	}, 60_000);
});
