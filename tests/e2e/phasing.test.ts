import { execFileSync } from 'node:child_process';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildSheetParams, phasingParams } from '../../src/lib/schemas/phasing';
import { Client, freshEmail } from '../support/client';
import { baseUrl, launch, screenshots } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(() => browser?.close());

describe('phasing check in Chromium (signed out)', () => {
	it('gives the first-tooth offset and draws the diagram', async () => {
		const page = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
		await page.goto(`${baseUrl}/phasing`);
		await page.getByLabel('Tooth at the sensor at TDC').fill('9');
		// Worked example (common practice): 36-1 with tooth 9 at TDC -> 90° BTDC.
		await expect.poll(() => page.getByTestId('first-tooth-offset').innerText()).toMatch(/90\s*° BTDC/);
		expect(await page.getByTestId('phasing-diagram').getAttribute('role')).toBe('img');
		await page.screenshot({ path: join(screenshots, 'phasing.png'), fullPage: true });
	});

	it('takes measured angles and a typed 52° V-twin, and downloads the build sheet (read back by poppler)', async () => {
		const context = await browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
		const page = await context.newPage();
		await page.goto(`${baseUrl}/phasing`);
		await page.getByLabel('Layout').selectOption('v-twin');
		await page.getByLabel('V angle (°)').fill('52');
		// The choice's radio is drawn as its label (ChoiceToggle): click what the user sees.
		await page.locator('label', { hasText: 'Measured angles' }).click();
		await expect.poll(() => page.getByRole('radio', { name: 'Measured angles' }).isChecked()).toBe(true);
		await page.getByLabel('Sensor angle (crank ° before the TDC mark)').fill('90');
		await page.getByLabel('Keyway angle (wheel °)').fill('15');
		await page.getByLabel('Key angle (crank ° before the TDC mark)').fill('5');
		// By geometry: the point at the sensor is (90 − 5) + 15 = 100° of wheel after tooth 0's leading
		// edge, tooth 10 of a 10° pitch, which passed the sensor 100° before TDC.
		await expect.poll(() => page.getByTestId('first-tooth-offset').innerText()).toMatch(/100\s*° BTDC/);
		expect(await page.getByTestId('tooth-at-tdc').innerText()).toBe('10');
		// Single-crankpin V-twin (engine layout definition, common practice): 360 + 52 and 360 − 52.
		expect(await page.getByTestId('firing-intervals').innerText()).toMatch(/412°\s*\/\s*308°/);
		const diagram = page.getByTestId('phasing-diagram');
		expect(await diagram.getAttribute('data-cylinders')).toBe('2');
		expect(await diagram.getAttribute('aria-label')).toMatch(/tooth 10 at the sensor, first-tooth offset 100° BTDC/);
		expect(await page.getByTestId('tdc-mark').count()).toBe(1);
		// The address follows, so the link shares the check.
		await expect.poll(() => new URL(page.url()).searchParams.get('keyAngle')).toBe('5');
		const shared = new URL(page.url()).searchParams;
		expect([shared.get('input'), shared.get('layout'), shared.get('vAngle'), shared.get('toothAtTdc')]).toEqual([
			'angles',
			'v-twin',
			'52',
			null
		]);

		// The build sheet: nothing to download until the wheel's size is known.
		const sheet = page.getByTestId('build-sheet');
		expect(await sheet.getByRole('link', { name: 'Download build sheet (PDF)' }).getAttribute('aria-disabled')).toBe('true');
		await page.getByLabel('Build name').fill('Twin 52 test');
		await page.getByLabel('Outside diameter (mm)').fill('120');
		await page.getByLabel('Tooth depth (mm)').fill('6');
		await page.getByLabel('Thickness (mm)').fill('4');
		await page.getByLabel('Material').selectOption('aluminium');
		await page.getByLabel('First piston-stop mark (°)').fill('-10');
		await page.getByLabel('Second piston-stop mark (°)').fill('19');
		await expect.poll(() => new URL(page.url()).searchParams.get('tdcB')).toBe('19');
		// The name goes as buildName: `build` in a tool's address is a build's id.
		expect([new URL(page.url()).searchParams.get('buildName'), new URL(page.url()).searchParams.get('build')]).toEqual([
			'Twin 52 test',
			null
		]);
		// Every name the form put in the address is a registered parameter of the check or the sheet.
		const registered = new Set<string>([...phasingParams.names, ...buildSheetParams.names]);
		expect([...new URL(page.url()).searchParams.keys()].filter((k) => !registered.has(k))).toEqual([]);
		await page.screenshot({ path: join(screenshots, 'phasing-angles-v-twin.png'), fullPage: true });

		const [download] = await Promise.all([
			page.waitForEvent('download'),
			sheet.getByRole('link', { name: 'Download build sheet (PDF)' }).click()
		]);
		expect(download.suggestedFilename()).toBe('build-sheet-twin-52-test.pdf');
		const file = join(screenshots, '..', download.suggestedFilename());
		await download.saveAs(file);
		expect(execFileSync('pdfinfo', [file], { encoding: 'utf8' })).toMatch(/Pages:\s+1\n/);
		const text = execFileSync('/usr/bin/pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
		expect(text).toContain('Build sheet: Twin 52 test');
		expect(text).toMatch(/First-tooth offset\s+100° BTDC/);
		expect(text).toMatch(/V-twin, 52° V, one crankpin; firing intervals 412 \/ 308°/);
		expect(text).toMatch(/Tooth at the sensor at TDC\s+10 \(tooth 0 = first after the gap, worked out from the angles\)/);
		expect(text).toContain('Aluminium alloy, 4.00 mm');
		// Marks at −10° and 19° (signed scale, negative = BTDC) put TDC half-way, (−10 + 19) / 2 =
		// 4.5° after the scale's 0 (piston-stop rule, common practice); the sheet prints them with sides.
		expect(text).toMatch(/10° BTDC and 19° ATDC: true TDC 4\.5° ATDC/);

		// Opening the shared address gives the same check.
		await page.goto(page.url());
		await expect.poll(() => page.getByTestId('first-tooth-offset').innerText()).toMatch(/100\s*° BTDC/);
		expect(await page.getByLabel('Build name').inputValue()).toBe('Twin 52 test');
		await context.close();
	});

	it('shows beside the field the same first refusal as GET /api/v1/phasing', async () => {
		// Typed from the range: the spark window starts between -30 and 90° BTDC.
		const query = 'teeth=36&missing=1&toothAtTdc=9&windowFrom=100';
		const api = await (await fetch(`${baseUrl}/api/v1/phasing?${query}`)).json();
		expect(api.refusals[0]).toEqual({ field: 'windowFrom', message: 'a number from -30 to 90° BTDC' });
		const page = await (await browser.newContext()).newPage();
		await page.goto(`${baseUrl}/phasing?${query}`);
		await expect.poll(() => page.locator('#phasing-windowFrom-error').innerText()).toBe('a number from -30 to 90° BTDC');
		expect(await page.getByLabel('Spark window from (° BTDC)').getAttribute('aria-invalid')).toBe('true');
	});

	it('opens a link of an earlier version (layout=v-twin-90) as a 90° V-twin', async () => {
		const page = await (await browser.newContext()).newPage();
		await page.goto(`${baseUrl}/phasing?teeth=36&missing=1&toothAtTdc=9&layout=v-twin-90`);
		expect(await page.getByLabel('Layout').inputValue()).toBe('v-twin');
		expect(await page.getByLabel('V angle (°)').inputValue()).toBe('90');
		// 90° V-twin on one crankpin: 450° then 270° (engine layout definition, common practice).
		await expect.poll(() => page.getByTestId('firing-intervals').innerText()).toMatch(/450°\s*\/\s*270°/);
	});
});

describe('phasing check for a build: the clocking applied to its wheel design', () => {
	it('writes a new revision with the keyway angle the page showed, and the designer links back', async () => {
		const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
		const page = await context.newPage();
		await page.goto(`${baseUrl}/signup`);
		await page.getByLabel('Name').fill('Clocking Builder');
		await page.getByLabel('E-mail').fill(freshEmail('e2e-clocking'));
		await page.getByLabel('Password').fill('a long enough password');
		await page.getByRole('button', { name: 'Create account' }).click();
		await page.waitForURL(`${baseUrl}/builds`);
		const api = new Client();
		for (const c of await context.cookies()) api.cookies.set(c.name, c.value);

		const build = await api.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Clocked single', engine: '' });
		expect(build.status).toBe(201);
		// A 36-1 with a custom keyway at 0° (sizes as tests/integration/wheel-label.test.ts).
		const wheel = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' };
		const keyed = { ...wheel, keyway: 'custom', keyWidth: '6', keyDepth: '2.8', keywayAngle: '0' };
		const design = await api.send<{ id: string }>('POST', `/api/v1/builds/${build.body.id}/designs`, {
			name: 'Crank wheel',
			params: keyed,
			message: 'as drawn'
		});
		expect(design.status).toBe(201);
		const designId = design.body.id;

		const target = 60;
		const keyFromSensor = 30;
		await page.goto(
			`${baseUrl}/phasing?build=${build.body.id}&design=${designId}&teeth=36&missing=1&toothAtTdc=9&target=${target}&keyFromSensor=${keyFromSensor}`
		);
		const clocking = page.getByTestId('clocking');
		const shown = Number(/set the keyway angle to\s*([\d.]+)°/.exec(await clocking.innerText())?.[1]);
		// Independent of src/lib/trade/phasing.ts, from design.md's convention (wheel angles count up in
		// the order points reach the sensor; crank wheel, one wheel degree per crank degree): tooth 0
		// must pass the sensor `target` degrees before TDC, so at TDC the point at the sensor is
		// `target` past it, and the key, `keyFromSensor` still to go, sits that much further on.
		const expected = (((target + keyFromSensor) % 360) + 360) % 360;
		expect(shown).toBe(expected);

		await page.getByRole('button', { name: 'Apply to Crank wheel' }).click();
		await page.getByText(/Revision 2 of “Crank wheel” saved with the keyway at/).waitFor();
		const { body } = await api.json<{ revisions: { number: number; params: Record<string, string>; message: string }[] }>(
			`/api/v1/designs/${designId}`
		);
		const head = body.revisions[0]!;
		expect(head.number).toBe(2);
		expect(Number(head.params.keywayAngle)).toBe(shown);
		expect(Number(head.params.keywayAngle)).toBe(expected);
		// Only the keyway angle changed; the reason is in the message.
		expect(head.params).toEqual({ ...body.revisions[1]!.params, keywayAngle: head.params.keywayAngle });
		expect(head.message).toBe(`Keyway clocked to ${expected}° from the phasing check: first tooth ${target}° BTDC`);
		expect(await page.getByRole('link', { name: 'Open it in the designer' }).getAttribute('href')).toBe(`/wheel?design=${designId}`);
		await page.screenshot({ path: join(screenshots, 'phasing-clocking-applied.png'), fullPage: true });

		// The designer opens the new revision and links on with its own numbers.
		await page.goto(`${baseUrl}/wheel?design=${designId}`);
		const phasingLink = new URL(
			(await page.getByTestId('next-tools').getByRole('link', { name: 'Check the phasing' }).getAttribute('href'))!,
			baseUrl
		);
		expect(Object.fromEntries(phasingLink.searchParams)).toMatchObject({
			design: designId,
			teeth: '36',
			missing: '1',
			keywayAngle: String(expected),
			od: '100',
			units: 'mm'
		});
		const tapeLink = new URL((await page.getByRole('link', { name: 'Print a degree tape for it' }).getAttribute('href'))!, baseUrl);
		expect(Object.fromEntries(tapeLink.searchParams)).toMatchObject({ design: designId, diameter: '100', units: 'mm' });
		await context.close();
	});
});

describe('phasing check on a phone and a desktop', () => {
	it('keeps the answer in view at 390 px while the last input is in view', async () => {
		const page = await (await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true })).newPage();
		await page.goto(`${baseUrl}/phasing?teeth=36&missing=1&toothAtTdc=9`);
		const offset = page.getByTestId('answer-bar-offset');
		// 36-1, tooth 9 at TDC: 9 pitches of 10° = 90° BTDC (common practice).
		await expect.poll(() => offset.innerText()).toMatch(/90\s*° BTDC/);
		const last = page.locator('form[aria-label="Phasing inputs"] input:not([type=radio])').last();
		await last.scrollIntoViewIfNeeded();
		// The last two inputs (the clocking wanted) typed with the last one in view: the answer stays, and stays in view.
		await page.getByLabel('First-tooth offset wanted (° BTDC)').fill('60');
		await last.fill('30');
		await expect.poll(() => page.getByTestId('clocking').count()).toBe(1);
		expect(await offset.innerText()).toMatch(/90\s*° BTDC/);
		await page.evaluate(() => new Promise(requestAnimationFrame));
		const box = (await offset.boundingBox())!;
		expect(box.y).toBeGreaterThanOrEqual(0);
		expect(box.y + box.height).toBeLessThanOrEqual(844);
		const lastBox = (await last.boundingBox())!;
		expect(lastBox.y).toBeGreaterThanOrEqual(0);
		expect(lastBox.y + lastBox.height).toBeLessThanOrEqual(844);
		// Nothing covers it: the element at its centre is the answer itself.
		expect(
			await offset.evaluate((el) => {
				const r = el.getBoundingClientRect();
				return el.contains(document.elementFromPoint(r.x + r.width / 2, r.y + r.height / 2));
			})
		).toBe(true);
		await page.screenshot({ path: join(screenshots, 'phasing-phone-sticky.png') });
	});

	for (const width of [390, 768, 1280]) {
		it(`never overflows its columns at ${width} px`, async () => {
			const page = await (await browser.newContext({ viewport: { width, height: 900 } })).newPage();
			await page.goto(`${baseUrl}/phasing?teeth=36&missing=1&toothAtTdc=9&layout=twin-270&target=60&keyFromSensor=30`);
			await expect.poll(() => page.getByTestId('first-tooth-offset').innerText()).toMatch(/° BTDC/);
			const over = await page.evaluate(() => {
				const wide = (el: Element) => el.scrollWidth > el.clientWidth + 1;
				const cards = [...document.querySelectorAll('main section, main fieldset, main form, main aside')].filter(wide);
				return {
					page: document.documentElement.scrollWidth > document.documentElement.clientWidth,
					cards: cards.map((el) => el.getAttribute('aria-labelledby') ?? el.getAttribute('aria-label') ?? el.tagName)
				};
			});
			expect(over).toEqual({ page: false, cards: [] });
			await page.screenshot({ path: join(screenshots, `phasing-${width}.png`), fullPage: true });
		});
	}
});
