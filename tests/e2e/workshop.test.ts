import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freshEmail, mailTo } from '../support/client';
import { baseUrl, launch, screenshots } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(() => browser?.close());

async function signUpIn(page: Page, name: string, email: string) {
	await page.getByLabel('Name').fill(name);
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill('a long enough password');
	await page.getByRole('button', { name: 'Create account' }).click();
}

describe('a workshop in Chromium: sign up, build, invite, viewer refused', () => {
	it('runs the whole round', async () => {
		const ownerEmail = freshEmail('e2e-owner');
		const viewerEmail = freshEmail('e2e-viewer');

		// The owner signs up and lands on their builds.
		const owner = await (await browser.newContext()).newPage();
		await owner.goto(`${baseUrl}/signup`);
		await signUpIn(owner, 'Rhea Owner', ownerEmail);
		await owner.waitForURL(`${baseUrl}/builds`);

		// ... creates a build.
		await owner.getByLabel('Build name').fill('Twin 650 conversion');
		await owner.getByLabel('Engine').fill('650 cc parallel twin, 360° crank');
		await owner.getByRole('button', { name: 'Create build' }).click();
		await expect.poll(() => owner.getByText('Twin 650 conversion').count()).toBeGreaterThan(0);

		// ... invites a viewer by e-mail.
		await owner.goto(`${baseUrl}/workshop`);
		await owner.getByLabel('E-mail to invite').fill(viewerEmail);
		await owner.getByLabel('Invite as').selectOption('viewer');
		await owner.getByRole('button', { name: 'Send invitation' }).click();
		await expect.poll(() => owner.getByText(`Invitation sent to ${viewerEmail}`).count()).toBe(1);
		await owner.screenshot({ path: join(screenshots, 'workshop-owner.png'), fullPage: true });

		// The invitation arrives in the SMTP fake; the second person opens it, signs up and accepts.
		const mail = await mailTo(viewerEmail, 'Invitation');
		expect(mail.link).toContain('/invite/');
		const viewer = await (await browser.newContext()).newPage();
		await viewer.goto(mail.link);
		await viewer.getByRole('link', { name: 'Create an account' }).click();
		await viewer.waitForURL(/\/signup/);
		expect(await viewer.getByLabel('E-mail').inputValue()).toBe(viewerEmail);
		await signUpIn(viewer, 'Vic Viewer', viewerEmail);
		await viewer.waitForURL(/\/invite\//);
		// Sign-up does not prove the address: the invitation waits for the link mailed to it.
		expect(await viewer.getByRole('button', { name: 'Accept invitation' }).count()).toBe(0);
		await expect.poll(() => viewer.getByText('Confirm').count()).toBeGreaterThan(0);
		const confirmation = await mailTo(viewerEmail, 'Confirm your');
		await viewer.goto(confirmation.link);
		await viewer.waitForURL(/\/invite\//);
		await viewer.getByRole('button', { name: 'Accept invitation' }).click();
		await viewer.waitForURL(`${baseUrl}/builds`);

		// The viewer sees the owner's build, and no way to change it ...
		await expect.poll(() => viewer.getByText('Twin 650 conversion').count()).toBeGreaterThan(0);
		expect(await viewer.getByRole('button', { name: 'Create build' }).count()).toBe(0);
		expect(await viewer.getByRole('button', { name: 'Delete' }).count()).toBe(0);
		await viewer.screenshot({ path: join(screenshots, 'builds-viewer.png'), fullPage: true });

		// ... and a change sent anyway (as a forged form post from the page) is refused.
		const refused = await viewer.evaluate(async () => {
			const res = await fetch('/builds?/create', {
				method: 'POST',
				headers: { 'x-sveltekit-action': 'true', accept: 'application/json' },
				body: new URLSearchParams({ name: 'Sneaky build' })
			});
			return { status: res.status, body: await res.json() };
		});
		expect(refused.status).toBe(403);
		expect(refused.body.error.message).toMatch(/viewer/);
		await viewer.reload();
		expect(await viewer.getByText('Sneaky build').count()).toBe(0);
	});
});
