// Saving wheel designs from the designer into a build, the revision history (compare, restore),
// and a stale save (409) resolved without losing either version. Real Chromium; the API through
// a Client holding the browser's own session cookies, so both act as the same person.
import { join } from 'node:path';
import type { BrowserContext, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, freshEmail } from '../support/client';
import { baseUrl, launch, screenshots } from './browser';
import type { Browser } from 'playwright-core';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(() => browser?.close());

type Revision = { number: number; params: Record<string, string>; message: string; restoredFrom: number | null; author: string | null };

/** The same person as the browser: its cookies (the session among them) copied into a Client. */
async function apiAs(context: BrowserContext): Promise<Client> {
	const client = new Client();
	for (const c of await context.cookies()) client.cookies.set(c.name, c.value);
	return client;
}

const text = async (l: Locator) => ((await l.count()) ? ((await l.first().innerText()) ?? '') : '');
const squash = (s: string) => s.replace(/\s+/g, ' ').trim();

async function setWheel(page: Page, values: Record<string, string>) {
	for (const [label, value] of Object.entries(values)) await page.getByLabel(label, { exact: true }).fill(value);
}

async function revisionsOf(api: Client, designId: string): Promise<Revision[]> {
	const res = await api.json<{ revisions: Revision[] }>(`/api/v1/designs/${designId}`);
	expect(res.status).toBe(200);
	return res.body.revisions;
}

describe('wheel design revisions in Chromium: save, history, restore, conflict', () => {
	it('saves into a build, compares and restores revisions, and resolves a stale save', async () => {
		const email = freshEmail('e2e-revisions');
		const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
		const page = await context.newPage();

		// Sign up (lands on the builds list, signed in).
		await page.goto(`${baseUrl}/signup`);
		await page.getByLabel('Name').fill('Rev Builder');
		await page.getByLabel('E-mail').fill(email);
		await page.getByLabel('Password').fill('a long enough password');
		await page.getByRole('button', { name: 'Create account' }).click();
		await page.waitForURL(`${baseUrl}/builds`);

		const api = await apiAs(context);
		const created = await api.send<{ id: string }>('POST', '/api/v1/builds', {
			name: 'Kart 125 single',
			engine: '125 cc two-stroke single'
		});
		expect(created.status).toBe(201);
		const buildId = created.body.id;

		// ---- A new design for the build: revision 1 ----
		await page.goto(`${baseUrl}/wheel?build=${buildId}`);
		const where = page.getByTestId('design-context');
		await expect.poll(async () => squash(await text(where))).toBe('Kart 125 single › New wheel design');
		const preview = page.getByTestId('wheel-preview');
		// 36-1, 100 mm (common practice: 36 positions, one left out, 35 teeth drawn).
		await setWheel(page, { 'Teeth (N)': '36', 'Missing (M)': '1', 'Outside diameter (mm)': '100', 'Tooth depth (mm)': '5' });
		await expect.poll(() => preview.getAttribute('data-teeth')).toBe('35');
		await page.getByLabel('Design name').fill('Crank wheel');
		await page.getByLabel('Revision message').fill('First cut, 36-1');
		await page.getByRole('button', { name: 'Save to build' }).click();
		await expect.poll(() => text(page.getByText(/Saved as revision 1 of/))).toContain('Crank wheel');

		// The address now names the design (and its revision), and the build parameter is gone.
		await expect.poll(() => new URL(page.url()).searchParams.get('design')).toMatch(/^[0-9a-f-]{36}$/);
		const designId = new URL(page.url()).searchParams.get('design')!;
		expect(new URL(page.url()).searchParams.get('build')).toBeNull();
		await expect.poll(async () => squash(await text(where))).toBe('Kart 125 single › Crank wheel, revision 1');

		// ---- Revision 2: 60-2 ----
		await setWheel(page, { 'Teeth (N)': '60', 'Missing (M)': '2' });
		await expect.poll(() => preview.getAttribute('data-teeth')).toBe('58');
		await expect.poll(async () => squash(await text(where))).toContain('unsaved changes');
		// Edits keep the design in the address.
		await expect.poll(() => new URL(page.url()).searchParams.get('teeth')).toBe('60');
		expect(new URL(page.url()).searchParams.get('design')).toBe(designId);
		await page.getByLabel('Revision message').fill('60-2 for the new ECU');
		await page.getByRole('button', { name: 'Save revision' }).click();
		await expect.poll(() => text(page.getByText(/Saved as revision 2 of/))).toContain('Crank wheel');
		await expect.poll(() => new URL(page.url()).searchParams.get('revision')).toBe('2');

		// ---- History: compare 1 and 2 ----
		await page.goto(`${baseUrl}/builds/${buildId}/designs/${designId}`);
		// Issue 20: revisions are chosen by number (or from the paged list), not from a select of them all.
		await page.getByLabel('A: from revision').fill('1');
		await page.getByLabel('B: to revision').fill('2');
		await page.getByRole('button', { name: 'Compare', exact: true }).click();
		await expect.poll(() => new URL(page.url()).searchParams.get('a')).toBe('1');
		const row = (name: string) => page.locator(`[data-testid="param-changes"] tr[data-param="${name}"]`);
		await expect.poll(async () => squash(await text(row('teeth')))).toMatch(/36 → 60$/);
		expect(squash(await text(row('missing')))).toMatch(/1 → 2$/);
		expect(await row('od').count()).toBe(0);
		// Both drawn side by side: 35 teeth for 36-1, 58 for 60-2 (common practice).
		expect(await page.getByTestId('compare-a-drawing').getByTestId('wheel-preview').getAttribute('data-teeth')).toBe('35');
		expect(await page.getByTestId('compare-b-drawing').getByTestId('wheel-preview').getAttribute('data-teeth')).toBe('58');
		const revisionItem = (n: number) => page.locator(`[data-testid="revision"][data-number="${n}"]`);
		expect(squash(await text(revisionItem(1)))).toContain('First cut, 36-1');
		expect(squash(await text(revisionItem(2)))).toContain(email);
		// Each revision's files, named with the revision (the project's own export names).
		const dxf = await api.get(`/api/v1/designs/${designId}/revisions/1/wheel.dxf`);
		expect(dxf.status).toBe(200);
		expect(dxf.headers.get('content-disposition')).toContain('r1.dxf');
		expect(await revisionItem(1).getByRole('link', { name: 'Download revision 1 as DXF' }).getAttribute('href')).toBe(
			`/api/v1/designs/${designId}/revisions/1/wheel.dxf`
		);
		expect(await revisionItem(1).getByRole('link', { name: 'Open in designer: revision 1' }).getAttribute('href')).toBe(
			`/wheel?design=${designId}&revision=1`
		);
		await page.screenshot({ path: join(screenshots, 'revisions-history.png'), fullPage: true });
		const phone = await context.newPage();
		await phone.setViewportSize({ width: 390, height: 844 });
		await phone.goto(`${baseUrl}/builds/${buildId}/designs/${designId}`);
		await phone.screenshot({ path: join(screenshots, 'revisions-history-phone.png'), fullPage: true });
		await phone.close();

		// ---- Restore revision 1: revision 3 restores 1 ----
		await revisionItem(1).getByRole('button', { name: 'Restore revision 1' }).click();
		await expect.poll(async () => squash(await text(revisionItem(3)))).toContain('restores 1');
		await expect.poll(() => text(page.getByText('Revision 3 restores revision 1.'))).not.toBe('');
		// The comparison follows the two newest again: 60-2 back to 36-1.
		await expect.poll(async () => squash(await text(row('teeth')))).toMatch(/60 → 36$/);

		// ---- A stale save: someone (the same person, through the API) saves while the page edits ----
		await page.goto(`${baseUrl}/wheel?design=${designId}`);
		await expect.poll(async () => squash(await text(where))).toBe('Kart 125 single › Crank wheel, revision 3');
		expect(await page.getByLabel('Teeth (N)', { exact: true }).inputValue()).toBe('36');
		await setWheel(page, { 'Teeth (N)': '48' });
		const head = (await revisionsOf(api, designId))[0]!;
		expect(head.number).toBe(3);
		const theirs = await api.send<{ revision: Revision }>('POST', `/api/v1/designs/${designId}/revisions`, {
			baseRevision: 3,
			params: { ...head.params, od: '120' },
			message: 'Bigger wheel, from the API'
		});
		expect(theirs.status).toBe(201);
		expect(theirs.body.revision.number).toBe(4);

		await page.getByLabel('Revision message').fill('Mine: 48-1');
		await page.getByRole('button', { name: 'Save revision' }).click();
		const panel = page.getByTestId('revision-conflict');
		await expect.poll(() => text(panel.getByRole('heading', { level: 2 }))).toBe(`Revision 4 was saved by ${email} while you were editing`);
		expect(await panel.getByTestId('conflict-theirs').getByTestId('wheel-preview').getAttribute('data-teeth')).toBe('35');
		expect(await panel.getByTestId('conflict-yours').getByTestId('wheel-preview').getAttribute('data-teeth')).toBe('47');
		const panelRow = (name: string) => panel.locator(`tr[data-param="${name}"]`);
		expect(squash(await text(panelRow('teeth')))).toMatch(/36 → 48$/);
		// Lengths with their unit now (issue 16: the comparison shows units).
		expect(squash(await text(panelRow('od')))).toMatch(/120 mm → 100 mm$/);
		await panel.screenshot({ path: join(screenshots, 'revisions-conflict-panel.png') });
		await page.evaluate(() => window.scrollTo(0, 0));
		await page.screenshot({ path: join(screenshots, 'revisions-conflict.png'), fullPage: true });
		// Nothing was written by the refused save.
		expect((await revisionsOf(api, designId))[0]!.number).toBe(4);

		// "Keep mine": saved deliberately on top of theirs, as revision 5.
		await panel.getByRole('button', { name: 'Keep mine' }).click();
		await expect.poll(() => text(page.getByText(/Saved as revision 5 of/))).toContain('Crank wheel');
		expect(await panel.count()).toBe(0);
		await expect.poll(async () => squash(await text(where))).toBe('Kart 125 single › Crank wheel, revision 5');

		// "Take theirs" loads the newest into the form; the unsaved version can be brought back and saved on top.
		const theirs2 = await api.send<{ revision: Revision }>('POST', `/api/v1/designs/${designId}/revisions`, {
			baseRevision: 5,
			params: { ...(await revisionsOf(api, designId))[0]!.params, od: '110' },
			message: 'od 110, from the API'
		});
		expect(theirs2.body.revision?.number).toBe(6);
		await setWheel(page, { 'Teeth (N)': '24' });
		await page.getByRole('button', { name: 'Save revision' }).click();
		await expect.poll(() => text(panel.getByRole('heading', { level: 2 }))).toContain('Revision 6 was saved by');
		await panel.getByRole('button', { name: 'Take theirs' }).click();
		expect(await page.getByLabel('Teeth (N)', { exact: true }).inputValue()).toBe('48');
		expect(await page.getByLabel('Outside diameter (mm)', { exact: true }).inputValue()).toBe('110');
		await expect.poll(async () => squash(await text(where))).toBe('Kart 125 single › Crank wheel, revision 6');
		await page.getByRole('button', { name: 'Bring mine back' }).click();
		expect(await page.getByLabel('Teeth (N)', { exact: true }).inputValue()).toBe('24');
		await page.getByLabel('Revision message').fill('24-1, on top of od 110');
		await page.getByRole('button', { name: 'Save revision' }).click();
		await expect.poll(() => text(page.getByText(/Saved as revision 7 of/))).toContain('Crank wheel');

		// Through the API: one revision per number, none doubled or skipped, each as saved.
		const all = await revisionsOf(api, designId);
		expect(all.map((r) => r.number)).toEqual([7, 6, 5, 4, 3, 2, 1]);
		const by = (n: number) => all.find((r) => r.number === n)!;
		expect(by(1).params).toMatchObject({ teeth: '36', missing: '1', od: '100' });
		expect(by(2).params).toMatchObject({ teeth: '60', missing: '2' });
		expect(by(3)).toMatchObject({ restoredFrom: 1, params: { teeth: '36', missing: '1' } });
		expect(by(4).params).toMatchObject({ teeth: '36', od: '120' });
		expect(by(5)).toMatchObject({ message: 'Mine: 48-1', params: { teeth: '48', od: '100' } });
		expect(by(6).params).toMatchObject({ teeth: '48', od: '110' });
		// Mine was 24 teeth on the 100 mm wheel it was edited from: brought back whole, saved on top of 6.
		expect(by(7)).toMatchObject({ message: '24-1, on top of od 110', params: { teeth: '24', od: '100' } });

		// Signed in at the bare designer: the wheel can go into one of the workshop's builds.
		await page.goto(`${baseUrl}/wheel`);
		expect(await page.getByTestId('design-context').count()).toBe(0);
		await expect
			.poll(async () => (await page.getByLabel('Build', { exact: true }).locator('option').allInnerTexts()).join('|'))
			.toContain('Kart 125 single');
		await setWheel(page, { 'Teeth (N)': '12', 'Missing (M)': '1' });
		await page.getByLabel('Design name').fill('Cam wheel');
		await page.getByRole('button', { name: 'Save to build' }).click();
		await expect.poll(() => text(page.getByText(/Saved as revision 1 of/))).toContain('Cam wheel');
		await expect.poll(async () => squash(await text(where))).toBe('Kart 125 single › Cam wheel, revision 1');
		await expect.poll(() => new URL(page.url()).searchParams.get('design')).toMatch(/^[0-9a-f-]{36}$/);
		const cam = new URL(page.url()).searchParams.get('design')!;
		expect(cam).not.toBe(designId);
		expect((await revisionsOf(api, cam)).map((r) => r.params.teeth)).toEqual(['12']);
		await context.close();
	});
});
