// Wheel photos in Chromium: upload on the build page with a progress bar, a refused file shown by
// its name, the photo reading from taps on a photo rendered from the project's own SVG export, and
// "Start a design from this" into the designer. The reading page on a phone, tapped by touch.
// Dragging taps and the drawing of issue 17's reading: photo-reading-page.test.ts.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { syntheticWheelPhoto, type SyntheticWheelPhoto } from '$support/synthetic-photos';
import { Client, freshEmail, signUp } from '../support/client';
import { baseUrl, launch, screenshots } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(() => browser?.close());

/** The page that shows a build's wheel photos (WheelPhotos). */
const photosPage = (buildId: string) => `${baseUrl}/builds/${buildId}`;

/** A browser context signed in as the client's account (its session cookie). */
async function signedIn(client: Client, options: Parameters<Browser['newContext']>[0] = {}): Promise<BrowserContext> {
	const context = await browser.newContext(options);
	await context.addCookies([...client.cookies].map(([name, value]) => ({ name, value, url: baseUrl })));
	return context;
}

/** Image pixels to the page's coordinates, from where the tap overlay is drawn. */
async function onScreen(overlay: Locator, shot: SyntheticWheelPhoto, p: { x: number; y: number }) {
	const box = (await overlay.boundingBox())!;
	return { x: box.x + (p.x * box.width) / shot.width, y: box.y + (p.y * box.height) / shot.height };
}

async function tapAll(page: Page, shot: SyntheticWheelPhoto, how: 'mouse' | 'touch') {
	const overlay = page.getByTestId('photo-taps');
	await overlay.scrollIntoViewIfNeeded();
	for (const p of [shot.taps.centre, ...shot.taps.tips]) {
		const at = await onScreen(overlay, shot, p);
		if (how === 'mouse') await page.mouse.click(at.x, at.y);
		else await page.touchscreen.tap(at.x, at.y);
	}
}

/** The tapped centre as the page holds it (image px). */
async function centreOf(page: Page) {
	const [x, y] = (await page.getByTestId('photo-taps').getAttribute('data-centre'))!.split(',').map(Number);
	return { x: x!, y: y! };
}

describe('wheel photos and the photo reading in Chromium', () => {
	it('uploads with progress, refuses a text file by its bytes, reads 36-1 from taps and starts a design', async () => {
		const client = await signUp('Photo Tester', freshEmail('e2e-photos'));
		const created = await client.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Single 500, copied wheel' });
		expect(created.status).toBe(201);
		const buildId = created.body.id;

		// A 36-1 wheel drawn from the project's own SVG export (so its truth is the geometry a user
		// would cut), turned, a little blurred and noisy, as a phone might take it.
		const shot = await syntheticWheelPhoto({
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
		expect([shot.truth.teeth, shot.truth.missing]).toEqual([36, 1]);
		const dir = mkdtempSync(join(tmpdir(), 'pw-photos-'));
		const photoFile = join(dir, 'wheel-36-1.jpg');
		writeFileSync(photoFile, shot.image);

		const context = await signedIn(client, { viewport: { width: 1280, height: 900 } });
		const page = await context.newPage();
		await page.goto(photosPage(buildId));

		// The upload: its progress bar fills and the thumbnail appears.
		await page.getByLabel('Choose photos').setInputFiles(photoFile);
		const row = page.getByTestId('photo-upload').filter({ hasText: 'wheel-36-1.jpg' });
		await expect.poll(() => row.getAttribute('data-status'), { timeout: 20_000 }).toBe('done');
		const bar = page.getByRole('progressbar', { name: /wheel-36-1\.jpg/ });
		const [value, max] = await bar.evaluate((el: HTMLProgressElement) => [el.value, el.max]);
		expect(max).toBeGreaterThan(shot.image.length * 0.9);
		expect(value).toBe(max);
		const thumbnail = page.getByRole('img', { name: 'wheel-36-1.jpg', exact: true });
		await expect.poll(() => thumbnail.count(), { timeout: 10_000 }).toBe(1);
		await thumbnail.scrollIntoViewIfNeeded();
		await expect.poll(() => thumbnail.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).toBe(true);
		// The page's data reloaded for the thumbnail; the finished upload still says so.
		expect(await row.getAttribute('data-status')).toBe('done');

		// A text file named like a JPEG is refused by its bytes, and the refusal names the file.
		await page
			.getByLabel('Choose photos')
			.setInputFiles({ name: 'wheel.jpg', mimeType: 'image/jpeg', buffer: Buffer.from('just some text, not a photo') });
		const refused = page.getByTestId('photo-upload').filter({ hasText: 'wheel.jpg' }).filter({ hasNotText: 'wheel-36-1' });
		await expect.poll(() => refused.getAttribute('data-status'), { timeout: 10_000 }).toBe('refused');
		expect(await refused.getByRole('alert').innerText()).toMatch(/^“wheel\.jpg”: JPEG, PNG or WebP only/);
		expect(await page.getByRole('img', { name: 'wheel.jpg', exact: true }).count()).toBe(0);
		await page.screenshot({ path: join(screenshots, 'photos-upload.png'), fullPage: true });

		// The photo reading: centre, then three tips, at the synthetic taps' positions.
		await page.getByRole('link', { name: /wheel-36-1\.jpg/ }).click();
		await page.waitForURL(/\/photos\//);
		expect(await page.getByTestId('reader-step').innerText()).toBe('Tap the centre of the wheel.');
		// A "tip" next to the centre is refused by the API, and the refusal is shown by the taps. A press
		// on a tapped point picks it (issue 17: points are dragged), so the tip is tapped on the rim and
		// dragged next to the centre.
		const near = await onScreen(page.getByTestId('photo-taps'), shot, shot.taps.centre);
		const rim = await onScreen(page.getByTestId('photo-taps'), shot, shot.taps.tips[0]!);
		await page.mouse.click(near.x, near.y);
		await page.mouse.click(rim.x, rim.y);
		await page.mouse.move(rim.x, rim.y);
		await page.mouse.down();
		await page.mouse.move(near.x + 3, near.y + 3, { steps: 8 });
		await page.mouse.up();
		await page.getByRole('button', { name: 'Read the teeth' }).click();
		await expect.poll(() => page.getByRole('alert').filter({ hasText: 'Tooth tips:' }).count()).toBe(1);
		expect(await page.getByRole('alert').filter({ hasText: 'Tooth tips:' }).innerText()).toMatch(/away from the centre/);
		await page.getByRole('button', { name: 'Start again' }).click();
		expect(await page.getByTestId('photo-taps').getAttribute('data-centre')).toBe('');
		await tapAll(page, shot, 'mouse');
		expect(await page.getByTestId('photo-taps').getAttribute('data-tips')).toBe('3');
		const placed = await centreOf(page);
		expect(Math.hypot(placed.x - shot.taps.centre.x, placed.y - shot.taps.centre.y)).toBeLessThan(2);
		// Undo takes the last tip off; tapping it again puts it back.
		await page.getByRole('button', { name: 'Undo' }).click();
		expect(await page.getByTestId('photo-taps').getAttribute('data-tips')).toBe('2');
		const last = await onScreen(page.getByTestId('photo-taps'), shot, shot.taps.tips[2]!);
		await page.mouse.click(last.x, last.y);
		// A diameter out of the API's range is refused beside its field (the page runs the API's own check).
		await page.getByLabel('Outside diameter').fill('5');
		await page.getByRole('button', { name: 'Read the teeth' }).click();
		await expect.poll(() => page.locator('#od-error').count()).toBe(1);
		expect(await page.locator('#od-error').innerText()).toBe('10 mm to 2000 mm');
		expect(await page.getByLabel('Outside diameter').getAttribute('aria-invalid')).toBe('true');
		await page.getByLabel('Outside diameter').fill('100');
		await page.getByRole('button', { name: 'Read the teeth' }).click();
		const answer = page.getByTestId('reading-answer');
		await expect.poll(() => page.getByTestId('reading-pattern').count(), { timeout: 20_000 }).toBe(1);
		// The truth: the 36-1 wheel the project's own SVG export drew.
		expect(await page.getByTestId('reading-pattern').innerText()).toBe(`${shot.truth.teeth}-${shot.truth.missing}`);
		expect(await answer.innerText()).toMatch(/Teeth seen\s+35/);
		expect(await page.getByTestId('reading-stored').innerText()).toMatch(/Stored with the photo/);
		expect(await page.getByTestId('found-gap').count()).toBe(1);
		await page.screenshot({ path: join(screenshots, 'photo-reading.png'), fullPage: true });

		// On a phone: the stored reading comes back with its taps; taps by touch land where the finger is.
		const phone = await signedIn(client, { viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, isMobile: true, hasTouch: true });
		const mobile = await phone.newPage();
		await mobile.goto(page.url());
		expect(await mobile.getByTestId('photo-taps').getAttribute('data-tips')).toBe('3');
		expect(await mobile.getByTestId('reading-pattern').innerText()).toBe('36-1');
		expect(await mobile.getByTestId('reading-stored').innerText()).toMatch(/stored with this photo/);
		await mobile.getByRole('button', { name: 'Start again' }).click();
		expect(await mobile.getByTestId('photo-taps').getAttribute('data-tips')).toBe('0');
		await tapAll(mobile, shot, 'touch');
		const touched = await centreOf(mobile);
		// The photo is shown about 360 px wide on this phone, so one screen px is about 4.5 image px.
		expect(Math.hypot(touched.x - shot.taps.centre.x, touched.y - shot.taps.centre.y)).toBeLessThan(8);
		await mobile.getByRole('button', { name: 'Read the teeth' }).tap();
		await expect
			.poll(
				() =>
					mobile
						.getByTestId('reading-pattern')
						.innerText()
						.catch(() => ''),
				{ timeout: 20_000 }
			)
			.toBe('36-1');
		await expect.poll(() => mobile.getByTestId('found-gap').count()).toBe(1);
		// Touch targets: every button on the page at least 44 px high (WCAG 2.5.5, the project's min-h-tap).
		const heights = await mobile.locator('main button').evaluateAll((els) => els.map((el) => el.getBoundingClientRect().height));
		expect(Math.min(...heights)).toBeGreaterThanOrEqual(44);
		await mobile.getByTestId('photo-taps').scrollIntoViewIfNeeded();
		await mobile.screenshot({ path: join(screenshots, 'photo-reading-phone.png') });
		await mobile.screenshot({ path: join(screenshots, 'photo-reading-phone-full.png'), fullPage: true });
		await phone.close();

		// "Start a design from this": the designer opens with the pattern read, for this build.
		await page.getByRole('link', { name: 'Start a design from this' }).click();
		await page.waitForURL(/\/wheel\?/);
		const query = new URL(page.url()).searchParams;
		expect([query.get('teeth'), query.get('missing'), query.get('od'), query.get('build')]).toEqual(['36', '1', '100', buildId]);
		expect(await page.getByLabel('Teeth (N)').inputValue()).toBe('36');
		expect(await page.getByLabel('Missing (M)').inputValue()).toBe('1');
		await expect.poll(() => page.getByTestId('wheel-preview').getAttribute('data-teeth')).toBe('35');

		// Removing the photo asks first.
		await page.goto(photosPage(buildId));
		page.once('dialog', (dialog) => void dialog.accept());
		await page.getByRole('button', { name: 'Remove wheel-36-1.jpg' }).click();
		await expect.poll(() => page.getByRole('img', { name: 'wheel-36-1.jpg', exact: true }).count()).toBe(0);
		expect((await client.json<{ photos: unknown[] }>(`/api/v1/builds/${buildId}/photos`)).body.photos).toEqual([]);
		await context.close();
	});
});
