// The tape page's drawing in Chromium, read as drawn (positions of the SVG's text on screen, at
// actual size one drawing unit is one CSS millimetre, 96 px per inch) against the turning-engine
// model (tests/support/turning-engine.ts: rigid rotation past a fixed pointer, s = r·θ).
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sideOf, underPointer, type Rotation } from '../support/turning-engine';
import { baseUrl, launch } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(() => browser?.close());

const MM_PER_PX = 25.4 / 96;

/** Every text of the preview with its drawn centre (mm from the page's left), and the arrow's shaft and head. */
async function drawn(page: Page) {
	const svg = page.getByTestId('tape-preview');
	await expect.poll(() => svg.locator('text').count()).toBeGreaterThan(5);
	return svg.evaluate((el, mmPerPx) => {
		const mid = (e: Element) => {
			const r = e.getBoundingClientRect();
			return ((r.left + r.right) / 2) * mmPerPx;
		};
		return {
			texts: [...el.querySelectorAll('text')].map((t) => ({ text: (t.textContent ?? '').trim(), x: mid(t) })),
			shaft: mid(el.querySelector('[data-testid="travel-shaft"]')!),
			head: mid(el.querySelector('[data-testid="travel-head"]')!)
		};
	}, MM_PER_PX);
}

describe('tape preview against the turning engine (Chromium)', () => {
	it.each([
		['cw', '76.2', '60', 76.2],
		['ccw', '76.2', '60', 76.2],
		['cw', '300', 'full', 300],
		['ccw', '120', '90', 120]
	] as const)(
		'%s, %s mm hub, window %s: the drawn label under the pointer reads θ BTDC before TDC, θ ATDC after',
		async (rotation, diameter, window, diameterMm) => {
			const context = await browser.newContext();
			const page = await context.newPage();
			await page.goto(
				`${baseUrl}/tape?${new URLSearchParams({ units: 'mm', diameter, window, rotation, tick: '1', mid: '5', label: '10', timing: 'idle:15, full:32', tdc2: 'cyl 2:320' })}`
			);
			const { texts, shaft, head } = await drawn(page);
			const tdc = texts.find((t) => t.text === 'TDC');
			expect(tdc, 'the TDC label').toBeDefined();
			const numbers = texts.filter((t) => /^\d+(\.\d+)?$/.test(t.text));
			const sides = texts.filter((t) => t.text === 'BTDC' || t.text === 'ATDC');
			expect(sides).toHaveLength(2);
			const engine = { hubDiameterMm: diameterMm, paperThicknessMm: 0.1, rotation: rotation as Rotation };

			let checked = 0;
			for (let theta = -170; theta <= 170; theta += 10) {
				const under = underPointer(engine, theta);
				const at = tdc!.x + under;
				const near = theta === 0 ? [tdc!] : numbers.filter((n) => Math.abs(n.x - at) < 0.3);
				if (theta !== 0 && !near.length) {
					// Not drawn: only past the window or past the shown stretch, never inside it.
					const shownMm = Math.max(...numbers.map((n) => Math.abs(n.x - tdc!.x)));
					expect(
						Math.abs(under) > shownMm - 0.3 || Math.abs(theta) >= Number(window === 'full' ? 180 : window),
						`${theta}° should be drawn`
					).toBe(true);
					continue;
				}
				for (const n of near) expect(n.text).toBe(theta === 0 ? 'TDC' : String(Math.abs(theta)));
				if (theta !== 0) {
					// The side word drawn on that side of TDC names it.
					const word = sides.find((s) => Math.sign(s.x - tdc!.x) === Math.sign(under));
					expect({ theta, side: word?.text }).toEqual({ theta, side: theta < 0 ? 'BTDC' : 'ATDC' });
				}
				checked++;
			}
			expect(checked).toBeGreaterThanOrEqual(9);

			// The marks, drawn centred on their lines: spec timings 15° and 32° BTDC, and cylinder 2's TDC
			// 320° after cylinder 1's, which the turning engine brings under the pointer 40° before it.
			for (const [text, crank] of [
				['idle 15°', -15],
				['full 32°', -32],
				['cyl 2', 320]
			] as const) {
				const mark = texts.find((t) => t.text === text);
				expect(mark, text).toBeDefined();
				expect(Math.abs(mark!.x - tdc!.x - underPointer(engine, crank)), text).toBeLessThan(0.3);
			}

			// The arrow: as the crank turns on, the point under the pointer moves along the tape the other
			// way from the tape's own motion.
			const step = underPointer(engine, 1) - underPointer(engine, 0);
			expect(sideOf(head - shaft)).toBe(sideOf(-step));
			await expect
				.poll(() => page.getByTestId('tape-fitting').innerText())
				.toContain(`BTDC numbers sit to the ${sideOf(underPointer(engine, -10))} of 0`);
			await context.close();
		}
	);

	it('the timing-light table on the page says the side and distance the engine gives', async () => {
		for (const rotation of ['cw', 'ccw'] as const) {
			const context = await browser.newContext();
			const page = await context.newPage();
			await page.goto(
				`${baseUrl}/tape?${new URLSearchParams({ units: 'mm', diameter: '150', rotation, curve: '1200:10, 3000:20, 900:-4' })}`
			);
			const engine = { hubDiameterMm: 150, paperThicknessMm: 0.1, rotation };
			for (const [advance, words] of [
				[10, '10° BTDC'],
				[20, '20° BTDC'],
				[-4, '4° ATDC']
			] as const) {
				const cell = page.locator('td', { hasText: words });
				await expect.poll(() => cell.count()).toBe(1);
				const m = /([\d.]+) mm\s+(left|right) of TDC/.exec(await cell.innerText());
				expect(m, `${words}: ${await cell.innerText()}`).not.toBeNull();
				const want = underPointer(engine, -advance);
				expect(m![2]).toBe(sideOf(want));
				expect(Math.abs(Number(m![1]) - Math.abs(want))).toBeLessThan(0.006);
			}
			await context.close();
		}
	});
});
