import { join } from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freshEmail, mailTo, signUp, type Client } from '../support/client';
import { baseUrl, launch, screenshots } from './browser';

// The builds list (fed by GET /api/v1/builds from the page, the view kept in the address) and a
// build's own page: a TDC record, a cutting package e-mailed through the SMTP fake, the activity log.

let browser: Browser;
let owner: Client;
let context: BrowserContext;

const named = [
	{ name: 'Alder 350 racer', engine: '344 cc horizontal single, 4-stroke' },
	{ name: 'Harrow HX450 K1', engine: '444 cc parallel twin, 180° crank' },
	{ name: 'Harrow HX450 cafe racer', engine: '444 cc parallel twin, 180° crank, open bell-mouths' },
	{ name: 'Thorne T740 roadster', engine: '744 cc parallel twin, 360° crank' },
	{ name: 'Yarrow Y650 street tracker', engine: '653 cc parallel twin, 360° crank' }
];
const spares = Array.from({ length: 20 }, (_, i) => ({
	name: `Spare build ${String(i + 1).padStart(2, '0')}`,
	engine: 'Kart single, 2-stroke'
}));

beforeAll(async () => {
	browser = await launch();
	owner = await signUp('Mara Bench', freshEmail('e2e-builds'));
	// 25 at once, as a busy shop's list would be: more than one page of 20.
	const created = await Promise.all([...named, ...spares].map((b) => owner.send('POST', '/api/v1/builds', b)));
	expect(created.map((r) => r.status)).toEqual(Array(25).fill(201));
	// The browser signs in with the same session as the API client.
	context = await browser.newContext();
	await context.addCookies([...owner.cookies].map(([name, value]) => ({ name, value, url: baseUrl })));
});
afterAll(() => browser?.close());

const rows = (page: Page) => page.getByTestId('builds-rows').getByRole('row');
const firstName = (page: Page) => rows(page).first().getByRole('rowheader').innerText();
const lastName = (page: Page) => rows(page).last().getByRole('rowheader').innerText();
const more = (page: Page) => page.getByRole('link', { name: 'More builds' });
const query = (page: Page) => new URL(page.url()).searchParams;
const nameHeader = (page: Page) => page.getByRole('columnheader').filter({ has: page.getByRole('button', { name: 'Name', exact: true }) });

describe('the builds list in Chromium', () => {
	it('searches, sorts and pages from the API without reloading, and keeps the view in the address', async () => {
		const page = await context.newPage();
		await page.goto(`${baseUrl}/builds`);
		// Server-rendered first page: 20 of 25, newest change first.
		expect(await rows(page).count()).toBe(20);
		// Issue 20: no total counted; a "More builds" link to the next keyset page instead of page numbers.
		expect(await page.getByTestId('builds-status').innerText()).toMatch(/^Builds, sorted by last change newest first/);
		expect(await more(page).count()).toBe(1);

		// A value set on the window lives only as long as the document: it proves no page load happened.
		await page.evaluate(() => ((window as unknown as Record<string, string>).__sameDocument = 'yes'));
		const sameDocument = () => page.evaluate(() => (window as unknown as Record<string, string>).__sameDocument);

		await page.getByLabel('Search builds').fill('hx450');
		await expect.poll(() => rows(page).count()).toBe(2);
		expect(await rows(page).allInnerTexts()).toEqual(
			expect.arrayContaining([expect.stringContaining('Harrow HX450 K1'), expect.stringContaining('Harrow HX450 cafe racer')])
		);
		await expect.poll(() => query(page).get('q')).toBe('hx450');
		expect(await more(page).count()).toBe(0);
		expect(await sameDocument()).toBe('yes');

		await page.getByLabel('Search builds').fill('');
		await expect.poll(() => rows(page).count()).toBe(20);
		await expect.poll(() => query(page).has('q')).toBe(false);

		// Sort by name: A to Z, then Z to A.
		await page.getByRole('button', { name: 'Name', exact: true }).click();
		await expect.poll(() => firstName(page)).toBe('Alder 350 racer');
		expect(await nameHeader(page).getAttribute('aria-sort')).toBe('ascending');
		expect(query(page).get('sort')).toBe('name');
		await page.getByRole('button', { name: 'Name', exact: true }).click();
		await expect.poll(() => firstName(page)).toBe('Yarrow Y650 street tracker');
		expect(await nameHeader(page).getAttribute('aria-sort')).toBe('descending');
		expect(query(page).get('dir')).toBe('desc');

		// Forward to the last page (Z to A: the spares 02 and 01, the two Harrows, the Alder) ...
		await more(page).click();
		await expect.poll(() => rows(page).count()).toBe(5);
		expect(await firstName(page)).toBe('Spare build 02');
		expect(await lastName(page)).toBe('Alder 350 racer');
		expect(query(page).get('cursor')).toMatch(/^[A-Za-z0-9_-]+$/);
		expect(await more(page).count()).toBe(0);

		// ... and the address, opened elsewhere, shows the same view from the server.
		const shared = await context.newPage();
		await shared.goto(page.url());
		expect(await firstName(shared)).toBe('Spare build 02');
		expect(await nameHeader(shared).getAttribute('aria-sort')).toBe('descending');
		expect(await shared.getByLabel('Search builds').inputValue()).toBe('');
		await shared.close();

		await page.getByRole('link', { name: 'Back to the first builds' }).click();
		await expect.poll(() => firstName(page)).toBe('Yarrow Y650 street tracker');
		expect(query(page).has('cursor')).toBe(false);
		expect(await sameDocument()).toBe('yes');
		await page.evaluate(() => window.scrollTo(0, 0));
		await page.screenshot({ path: join(screenshots, 'builds-list.png'), fullPage: true });
		// On a phone the rows become cards and the sortable headers stay as a row of buttons.
		await page.setViewportSize({ width: 390, height: 844 });
		await page.screenshot({ path: join(screenshots, 'builds-list-phone.png'), fullPage: true });
		await page.close();
	});
});

describe('a build’s page in Chromium', () => {
	it('adds a TDC record, sends a cutting package to the SMTP fake and logs it', async () => {
		const page = await context.newPage();
		await page.goto(`${baseUrl}/builds?q=T740`);
		expect(await rows(page).count()).toBe(1);
		await page.getByRole('link', { name: 'Thorne T740 roadster' }).click();
		await page.waitForURL(/\/builds\/[0-9a-f-]{36}$/);
		const buildId = new URL(page.url()).pathname.split('/').pop()!;
		expect(await page.getByRole('heading', { level: 1 }).innerText()).toBe('Thorne T740 roadster');
		expect(await page.getByRole('link', { name: 'Build sheet (PDF)' }).getAttribute('href')).toBe(
			`/api/v1/builds/${buildId}/build-sheet.pdf`
		);
		expect(await page.getByRole('link', { name: 'Set up the engine profile' }).getAttribute('href')).toBe(`/phasing?build=${buildId}`);

		// A reading out of range is refused beside its field (the API names it params.a).
		await page.getByLabel('First mark').fill('400');
		await page.getByLabel('Second mark').fill('15');
		await page.getByRole('button', { name: 'Save TDC record' }).click();
		await expect.poll(() => page.locator('#tdc-a-error').textContent()).toMatch(/−180 to 180 \(negative = BTDC\)/);

		// Marks −14° and 15° on the signed scale (negative = BTDC): TDC half-way between, at 0.5° ATDC
		// (common practice: piston-stop TDC = a + (b − a) / 2); the record shows the sides.
		await page.getByLabel('Label', { exact: true }).fill('Cylinder 1, plug-hole stop');
		await page.getByLabel('First mark').fill('-14');
		await page.getByRole('button', { name: 'Save TDC record' }).click();
		await expect.poll(() => page.getByTestId('tdc-records').innerText()).toContain('Cylinder 1, plug-hole stop');
		const record = await page.getByTestId('tdc-records').innerText();
		expect(record).toMatch(/TDC 0\.5° ATDC of the scale’s 0/);
		expect(record).toMatch(/from marks 14° BTDC and 15° ATDC, signed scale/);
		expect(await page.locator('#tdc-a-error').count()).toBe(0);
		expect(await page.getByTestId('tdc-records').getByRole('link', { name: 'Open in tool' }).getAttribute('href')).toBe(
			'/tdc?a=14+BTDC&b=15+ATDC&scale=signed'
		);

		// A wheel design saved through the API shows after a reload, with its head revision's files.
		const design = await owner.send<{ id: string; revision: number }>('POST', `/api/v1/builds/${buildId}/designs`, {
			name: 'Crank wheel 36-1',
			params: { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' },
			message: 'First cut'
		});
		expect(design.status).toBe(201);
		await page.reload();
		const designs = page.getByTestId('designs');
		expect(await designs.innerText()).toContain('Crank wheel 36-1');
		expect(await designs.getByRole('link', { name: 'DXF' }).getAttribute('href')).toBe(
			`/api/v1/designs/${design.body.id}/revisions/1/wheel.dxf`
		);
		expect(await designs.getByRole('link', { name: 'Open in designer' }).getAttribute('href')).toBe(`/wheel?design=${design.body.id}`);

		// The cutting package goes to a fresh address.
		const fabricator = freshEmail('e2e-fabricator');
		expect(await page.getByLabel('Wheel design', { exact: true }).inputValue()).toBe(design.body.id);
		expect(await page.getByLabel('Revision', { exact: true }).inputValue()).toBe('1');
		await page.getByLabel('Fabricator’s e-mail').fill(fabricator);
		await page.getByLabel('Quantity').fill('2');
		await page.getByLabel('Notes for the fabricator').fill('Please deburr; two off for the spares box.');
		await page.getByRole('button', { name: 'Send cutting package' }).click();
		await expect
			.poll(() => page.getByRole('status').filter({ hasText: 'Sent to' }).innerText(), { timeout: 15_000 })
			.toBe(`Sent to ${fabricator} with wheel-36-1-100mm-r1.dxf and cutting-spec-36-1-100mm-r1.pdf.`);

		// The SMTP fake has it, with both files (the project's own export names: pattern, diameter, revision).
		type Mail = { subject: string; text: string; attachments: { filename: string; contentType: string; size: number }[] };
		let mail: Mail[] = [];
		await expect
			.poll(async () => {
				mail = (await (await fetch(`${process.env.MAILBOX_URL}/messages?to=${encodeURIComponent(fabricator)}`)).json()) as Mail[];
				return mail.length;
			})
			.toBe(1);
		// Names are quoted data in our messages (messages.ts).
		expect(mail[0]!.subject).toContain('“Crank wheel 36-1” revision 1 (2 off');
		expect(mail[0]!.text).toContain('Thorne T740 roadster');
		const files = mail[0]!.attachments.map((a) => a.filename).sort();
		expect(files).toEqual(['cutting-spec-36-1-100mm-r1.pdf', 'wheel-36-1-100mm-r1.dxf']);
		for (const a of mail[0]!.attachments) expect(a.size).toBeGreaterThan(500);
		expect(mail[0]!.attachments.find((a) => a.filename.endsWith('.pdf'))!.contentType).toBe('application/pdf');

		// ... and the page lists it and logs it, newest first.
		await expect.poll(() => page.getByTestId('cutting-packages').innerText()).toContain(fabricator);
		const log = page.getByTestId('activity-log').getByRole('listitem');
		expect(await log.first().innerText()).toContain(`Cutting package for “Crank wheel 36-1” revision 1 (2 off) sent to ${fabricator}`);
		expect(await page.getByTestId('activity-log').innerText()).toContain('TDC 0.5° ATDC');

		// An owner invites from the build's page: into the build's workshop, and the build's log says so.
		const newcomer = freshEmail('e2e-newcomer');
		await page.getByLabel('E-mail to invite').fill(newcomer);
		await page.getByRole('button', { name: 'Send invitation' }).click();
		await page.getByText(`Invitation sent to ${newcomer}`).waitFor();
		const invitation = await mailTo(newcomer, 'Invitation');
		expect(invitation.link).toMatch(/\/invite\//);
		await page.reload();
		expect(await log.first().innerText()).toContain(`${newcomer} invited into`);

		await page.evaluate(() => window.scrollTo(0, 0));
		await page.screenshot({ path: join(screenshots, 'build-page.png'), fullPage: true });
		await page.close();
	});
});
