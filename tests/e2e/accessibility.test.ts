// Every main page checked with axe-core (Deque's rule engine for WCAG 2.x, run inside real
// Chromium) in the light and the dark theme: no violation of impact "serious" or "critical" is
// allowed; the lesser ones are printed so they stay visible.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { syntheticWheelPhoto } from '$support/synthetic-photos';
import { unavailablePage, unavailablePagePolicy } from '../../src/lib/server/unavailable';
import { palette } from '../../tailwind.config';
import { Client, freshEmail, signUp } from '../support/client';
import { baseUrl, contextFor, launch } from './browser';

const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

type Violation = {
	id: string;
	impact: string | null;
	help: string;
	helpUrl: string;
	nodes: { target: unknown[]; failureSummary?: string }[];
};

let browser: Browser;
let owner: Client;
const ids = { build: '', design: '', photo: '' };

const wheel = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' };

beforeAll(async () => {
	browser = await launch();
	owner = await signUp('Axe Owner', freshEmail('e2e-axe'));
	const created = async (res: Promise<{ status: number; body: { id: string } | { photos: { id: string }[] } }>, what: string) => {
		const r = await res;
		expect(r.status, what).toBe(201);
		return 'id' in r.body ? r.body.id : r.body.photos[0]!.id;
	};
	ids.build = await created(owner.send('POST', '/api/v1/builds', { name: 'Accessibility single', engine: '500 cc single' }), 'build');
	expect(
		(
			await owner.send('PUT', `/api/v1/builds/${ids.build}/engine`, {
				params: { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'single-4', rpm: '9000' }
			})
		).status
	).toBe(200);
	ids.design = await created(
		owner.send('POST', `/api/v1/builds/${ids.build}/designs`, { name: 'Crank wheel', params: wheel, message: 'as drawn' }),
		'design'
	);
	// A second revision, so the history page has something to compare.
	expect(
		(
			await owner.send('POST', `/api/v1/designs/${ids.design}/revisions`, {
				baseRevision: 1,
				params: { ...wheel, od: '110' },
				message: 'bigger'
			})
		).status
	).toBe(201);
	await created(
		owner.send('POST', `/api/v1/builds/${ids.build}/tdc-records`, { label: 'cold', params: { a: '-14', b: '15' } }),
		'TDC record'
	);
	await created(
		owner.send('POST', `/api/v1/builds/${ids.build}/tapes`, { label: 'flywheel', params: { units: 'mm', diameter: '120' } }),
		'tape'
	);
	const shot = await syntheticWheelPhoto({
		teeth: 36,
		missing: 1,
		width: 800,
		height: 600,
		rotationDeg: 20,
		noise: 3,
		blur: 1,
		tips: 3,
		seed: 5
	});
	const form = new FormData();
	form.append('file', new Blob([new Uint8Array(shot.image)], { type: 'image/jpeg' }), 'axe-wheel.jpg');
	ids.photo = await created(owner.send('POST', `/api/v1/builds/${ids.build}/photos`, form), 'photo');
	expect((await owner.send('POST', `/api/v1/photos/${ids.photo}/reading`, { ...shot.taps, odMm: 100 })).status).toBe(200);
}, 120_000);
afterAll(() => browser?.close());

type Check = { path: string; note?: string; phone?: boolean; act?: (page: Page) => Promise<void> };

const signedOut: Check[] = [
	{ path: '/' },
	{ path: '/wheel' },
	// Refusals and warnings, reached by address (the tools keep their inputs in the query).
	{ path: '/wheel?teeth=0&od=100&depth=5', note: 'a refused tooth count' },
	{ path: '/wheel?teeth=60&missing=2&od=40&depth=1.5', note: 'teeth too small to cut or sense' },
	{ path: '/tape' },
	{ path: '/tape?diameter=5', note: 'a refused diameter' },
	{ path: '/tdc' },
	{ path: '/tdc?a=400&b=15', note: 'a refused reading' },
	{ path: '/phasing' },
	{ path: '/phasing?teeth=36&missing=1&toothAtTdc=9&layout=twin-270&rpm=9000', note: 'a checked twin, with its diagram' },
	{ path: '/phasing?teeth=36&missing=1&toothAtTdc=99', note: 'a refused tooth' },
	{ path: '/signal' },
	{ path: '/signal?teeth=36&missing=1&toothAtTdc=9&ratio=0', note: 'a refused detection ratio' },
	{ path: '/signin' },
	{
		path: '/signin',
		note: 'a refused password',
		act: async (page) => {
			await page.getByLabel('E-mail', { exact: true }).fill(freshEmail('e2e-axe-nobody'));
			await page.getByLabel('Password', { exact: true }).fill('not the password');
			await page.getByRole('button', { name: 'Sign in', exact: true }).click();
			await page.locator('[aria-invalid="true"], [role="alert"]').first().waitFor();
		}
	},
	{ path: '/signup' },
	{ path: '/docs/api', note: 'the API page, a route opened', act: (page) => page.locator('#getWheel summary').click() },
	{
		path: '/signup',
		note: 'refused fields',
		act: async (page) => {
			await page.getByLabel('E-mail', { exact: true }).fill('not an address');
			await page.getByLabel('Password', { exact: true }).fill('short');
			await page.getByRole('button', { name: 'Create account' }).click();
			await page.locator('[aria-invalid="true"]').first().waitFor();
		}
	},
	{ path: '/', note: 'phone, menu open', phone: true, act: (page) => page.getByRole('button', { name: 'Menu' }).click() }
];
const signedIn = (): Check[] => [
	{ path: '/' },
	{ path: '/wheel' },
	{ path: `/wheel?design=${ids.design}&revision=2`, note: 'opened from a design' },
	{ path: '/builds' },
	{ path: `/builds/${ids.build}` },
	{ path: `/builds/${ids.build}/designs/${ids.design}` },
	{ path: `/builds/${ids.build}/photos/${ids.photo}` },
	{ path: '/workshop' },
	{ path: '/builds', note: 'phone, menu open', phone: true, act: (page) => page.getByRole('button', { name: 'Menu' }).click() }
];

type Audit = { violations: Violation[]; passed: string[]; review: string[]; drawing: DrawingText };
type DrawingText = { measured: number; overPhoto: number; faint: string[] };

/**
 * The labels inside the SVG drawings (tooth numbers, tape figures, diagram words), which axe
 * leaves for a person to review: each one's fill against what is painted behind its middle (the
 * last filled shape before it in the drawing, its own halo where it has one, else the page behind
 * the drawing), by the contrast ratio of WCAG 2.2 (relative luminance, SC 1.4.3: 4.5:1, or 3:1
 * for large text: 24 px, or 18.66 px bold). Runs in the page.
 */
function measureDrawingText(): DrawingText {
	type C = { r: number; g: number; b: number; a: number };
	const parse = (s: string): C | null => {
		const m = /rgba?\(([^)]+)\)/.exec(s);
		if (!m) return null;
		const p = m[1]!
			.split(/[\s,/]+/)
			.filter(Boolean)
			.map(Number);
		return { r: p[0]!, g: p[1]!, b: p[2]!, a: p[3] ?? 1 };
	};
	const over = (top: C, below: C): C => ({
		r: top.r * top.a + below.r * (1 - top.a),
		g: top.g * top.a + below.g * (1 - top.a),
		b: top.b * top.a + below.b * (1 - top.a),
		a: 1
	});
	const lum = (c: C) => {
		const [r, g, b] = [c.r, c.g, c.b].map((v) => v / 255).map((v) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
		return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
	};
	const ratio = (a: C, b: C) => {
		const [hi, lo] = [lum(a), lum(b)].sort((x, y) => y - x);
		return (hi! + 0.05) / (lo! + 0.05);
	};
	const opacity = (el: Element | null) => {
		let o = 1;
		for (let e = el; e; e = e.parentElement) o *= Number(getComputedStyle(e).opacity);
		return o;
	};
	const pageBehind = (el: Element | null): C => {
		for (let e = el; e; e = e.parentElement) {
			const c = parse(getComputedStyle(e).backgroundColor);
			if (c && c.a > 0) return c.a < 1 ? over(c, pageBehind(e.parentElement)) : c;
		}
		return { r: 255, g: 255, b: 255, a: 1 };
	};
	const result: DrawingText = { measured: 0, overPhoto: 0, faint: [] };
	for (const text of document.querySelectorAll<SVGTextElement>('svg text')) {
		const box = text.getBoundingClientRect();
		const style = getComputedStyle(text);
		const fill = parse(style.fill);
		if (box.width < 1 || box.height < 1 || style.visibility === 'hidden' || !fill || !text.textContent?.trim()) continue;
		const svg = text.ownerSVGElement!;
		let behind = pageBehind(svg.parentElement);
		const halo = parse(style.stroke);
		if (style.paintOrder.startsWith('stroke') && halo && parseFloat(style.strokeWidth) > 0) {
			behind = over({ ...halo, a: halo.a * Number(style.strokeOpacity) }, behind);
		} else {
			const middle = new DOMPoint(box.left + box.width / 2, box.top + box.height / 2);
			let photo = false;
			// Painter's order: what comes before the text in the drawing lies under it.
			for (const shape of svg.querySelectorAll<SVGGeometryElement | SVGImageElement>('circle, ellipse, path, polygon, rect, image')) {
				if (!(shape.compareDocumentPosition(text) & Node.DOCUMENT_POSITION_FOLLOWING)) break;
				const ctm = shape.getScreenCTM();
				if (!ctm) continue;
				const local = middle.matrixTransform(ctm.inverse());
				if (shape instanceof SVGImageElement) {
					const r = shape.getBBox();
					if (local.x >= r.x && local.x <= r.x + r.width && local.y >= r.y && local.y <= r.y + r.height) photo = true;
					continue;
				}
				const paint = parse(getComputedStyle(shape).fill);
				const alpha = paint ? paint.a * Number(getComputedStyle(shape).fillOpacity) * opacity(shape) : 0;
				if (paint && alpha > 0 && shape.isPointInFill(local)) {
					behind = over({ ...paint, a: alpha }, behind);
					if (alpha >= 0.5) photo = false;
				}
			}
			if (photo) {
				result.overPhoto++;
				continue;
			}
		}
		const ctm = text.getScreenCTM();
		const px = parseFloat(style.fontSize) * (ctm ? Math.hypot(ctm.a, ctm.b) : 1);
		const large = px >= 24 || (px >= 18.66 && Number(style.fontWeight) >= 700);
		const shown = over({ ...fill, a: fill.a * Number(style.fillOpacity) * opacity(text) }, behind);
		const contrast = ratio(shown, behind);
		result.measured++;
		if (contrast < (large ? 3 : 4.5))
			result.faint.push(
				`“${text.textContent.trim()}” ${contrast.toFixed(2)}:1 (${style.fill} on rgb(${behind.r.toFixed(0)}, ${behind.g.toFixed(0)}, ${behind.b.toFixed(0)}), ${px.toFixed(1)} px)`
			);
	}
	return result;
}

/** Runs axe on one page in one theme, after `act` when given; the page's own answer must be 200. */
async function audit(check: Check, theme: 'light' | 'dark', session: Map<string, string>): Promise<Audit> {
	const cookies = new Map(session).set('pw-theme', theme);
	const viewport = check.phone ? { width: 390, height: 844 } : { width: 1280, height: 900 };
	// bypassCSP: axe goes in as an inline script, which a Content-Security-Policy may refuse.
	const context = await contextFor(browser, cookies, {
		viewport,
		isMobile: check.phone,
		hasTouch: check.phone,
		colorScheme: theme,
		bypassCSP: true
	});
	try {
		const page = await context.newPage();
		const response = await page.goto(new URL(check.path, baseUrl).href, { waitUntil: 'networkidle' });
		expect(response?.status(), check.path).toBe(200);
		expect(await page.locator('html').getAttribute('data-theme')).toBe(theme);
		if (check.act) {
			await check.act(page);
			await page.waitForLoadState('networkidle');
		}
		await page.addScriptTag({ content: axeSource });
		const found = await page.evaluate(async () => {
			type Node = { target: string[]; any: { data?: { messageKey?: string; contrastRatio?: number } | null }[] };
			type Result = { violations: Violation[]; passes: { id: string }[]; incomplete: { id: string; nodes: Node[] }[] };
			const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<Result> } }).axe;
			const result = await axe.run(document, { resultTypes: ['violations', 'incomplete'] });
			// What axe could not decide, with its reason (text over an image or a drawing, say).
			const review = result.incomplete.map(
				(r) =>
					`${r.id} [${r.nodes.map((n) => `${n.target.join(' ')}: ${n.any.map((a) => a.data?.messageKey ?? a.data?.contrastRatio ?? '?').join('/')}`).join('; ')}]`
			);
			return { violations: result.violations, passed: result.passes.map((r) => r.id), review };
		});
		return { ...found, drawing: await page.evaluate(measureDrawingText) };
	} finally {
		await context.close();
	}
}

const where = (c: Check, theme: string) => `${theme} ${c.path}${c.note ? ` (${c.note})` : ''}`;
const describeAll = (c: Check, theme: string, list: Violation[]) =>
	list.map(
		(v) =>
			`${where(c, theme)}: [${v.impact}] ${v.id}: ${v.help} at ${v.nodes
				.map((n) => n.target.join(' '))
				.slice(0, 5)
				.join(' | ')}${v.nodes.length > 5 ? ` (+${v.nodes.length - 5})` : ''}`
	);
const isSerious = (v: Violation) => v.impact === 'serious' || v.impact === 'critical';

async function auditAll(checks: Check[], theme: 'light' | 'dark', session: Map<string, string>) {
	const serious: string[] = [];
	for (const check of checks) {
		const found = await audit(check, theme, session);
		// Contrast is the rule the theme decides: it must have run and found text to measure.
		expect(found.passed, `${where(check, theme)}: axe measured no text contrast`).toContain('color-contrast');
		serious.push(...describeAll(check, theme, found.violations.filter(isSerious)));
		serious.push(...found.drawing.faint.map((f) => `${where(check, theme)}: [serious] drawing text below the contrast minimum: ${f}`));
		for (const line of describeAll(
			check,
			theme,
			found.violations.filter((v) => !isSerious(v))
		))
			console.log(`axe (lesser) ${line}`);
		const drawn =
			found.drawing.measured || found.drawing.overPhoto
				? `; drawing labels: ${found.drawing.measured} measured, ${found.drawing.faint.length} too faint${found.drawing.overPhoto ? `, ${found.drawing.overPhoto} over the photo` : ''}`
				: '';
		console.log(
			`axe ${where(check, theme)}: ${found.passed.length} rules passed, ${found.violations.length} violated${drawn}${found.review.length ? `; for a person to review: ${found.review.join(', ')}` : ''}`
		);
	}
	return serious;
}

describe('axe-core on every main page, light and dark', () => {
	for (const theme of ['light', 'dark'] as const) {
		it(`signed out, ${theme}: no serious or critical violations`, async () => {
			expect(await auditAll(signedOut, theme, new Map())).toEqual([]);
		}, 240_000);

		it(`signed in, ${theme}: no serious or critical violations`, async () => {
			expect(await auditAll(signedIn(), theme, owner.cookies)).toEqual([]);
		}, 240_000);
	}

	it('the page shown while the database is away: styled under its own policy, no violations, light and dark', async () => {
		for (const theme of ['light', 'dark'] as const) {
			// Served with the headers the app sends it with, so Chromium enforces its policy: the
			// style must get through by its hash, and axe goes in through the debugger instead.
			const context = await browser.newContext({ colorScheme: theme });
			try {
				const page = await context.newPage();
				const address = new URL('/unavailable-page-check', baseUrl).href;
				await page.route(address, (route) =>
					route.fulfill({
						status: 503,
						body: unavailablePage(theme),
						headers: { 'content-type': 'text/html; charset=utf-8', 'content-security-policy': unavailablePagePolicy }
					})
				);
				const refused: string[] = [];
				page.on('console', (m) => /Content Security Policy/i.test(m.text()) && refused.push(m.text()));
				await page.goto(address);
				const paper = palette.paper[theme];
				const rgb = `rgb(${[1, 3, 5].map((i) => parseInt(paper.slice(i, i + 2), 16)).join(', ')})`;
				expect(await page.evaluate(() => getComputedStyle(document.body).backgroundColor)).toBe(rgb);
				expect(refused).toEqual([]);
				await page.evaluate(axeSource);
				const found = await page.evaluate(async () => {
					const axe = (
						window as unknown as { axe: { run: (ctx: Document) => Promise<{ violations: Violation[]; passes: { id: string }[] }> } }
					).axe;
					const result = await axe.run(document);
					return { violations: result.violations.map((v) => `${v.id}: ${v.help}`), passed: result.passes.map((r) => r.id) };
				});
				expect(found.violations, theme).toEqual([]);
				expect(found.passed).toContain('color-contrast');
			} finally {
				await context.close();
			}
		}
	});

	it('finds what it is meant to find: an unlabelled field and faint text, in the page and in a drawing', async () => {
		// A check that cannot fail proves nothing: axe must flag these two (WCAG 2.2 1.3.1 / 4.1.2
		// and 1.4.3 contrast minimum), so an empty list above means the rules really ran.
		const context = await browser.newContext({ bypassCSP: true });
		try {
			const page = await context.newPage();
			await page.setContent(
				'<!doctype html><html lang="en"><head><title>t</title></head><body><main><input type="text"><p style="color:#bbb;background:#fff">faint</p></main></body></html>'
			);
			await page.addScriptTag({ content: axeSource });
			const ids = await page.evaluate(async () => {
				const axe = (window as unknown as { axe: { run: (ctx: Document) => Promise<{ violations: Violation[] }> } }).axe;
				return (await axe.run(document)).violations.map((v) => v.id);
			});
			expect(ids).toEqual(expect.arrayContaining(['label', 'color-contrast']));
			// And the drawing check: faint grey on white fails (about 1.9:1), the same grey with a
			// dark halo behind it passes, ink-dark text passes.
			await page.setContent(
				'<!doctype html><html lang="en"><body style="background:#fff"><svg width="300" height="100" viewBox="0 0 300 100">' +
					'<text x="10" y="30" font-size="14" fill="#bbb">faint</text>' +
					'<text x="110" y="30" font-size="14" fill="#bbb" stroke="#000" stroke-width="4" paint-order="stroke">haloed</text>' +
					'<rect x="200" y="10" width="90" height="40" fill="#16181b"/><text x="210" y="30" font-size="14" fill="#555">on dark</text>' +
					'<text x="10" y="80" font-size="14" fill="#16181b">ink</text></svg></body></html>'
			);
			const drawing = await page.evaluate(measureDrawingText);
			expect(drawing.measured).toBe(4);
			expect(drawing.faint.map((f) => f.split('”')[0])).toEqual(['“faint', '“on dark']);
		} finally {
			await context.close();
		}
	});
});
