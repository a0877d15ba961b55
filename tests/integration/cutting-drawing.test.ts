// The cutting package's shop drawing through the API: previewed before sending (read access is
// enough), read back with poppler (pdftotext, pdfinfo: not our code), downloaded again for a
// package already sent, and the sender's copy of the order in the mailbox.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { appUrl, Client, freshEmail, mailTo, signUp } from '../support/client';
import { wheel36x1Keyed as keyed } from '../support/example-wheels';

const dir = mkdtempSync(join(tmpdir(), 'phasewright-cutting-drawing-'));

async function owner(label: string) {
	const email = freshEmail(label);
	const client = await signUp(`${label} owner`, email);
	return { client, email };
}

async function newBuild(client: Client, name: string) {
	const res = await client.send<{ id: string }>('POST', '/api/v1/builds', { name, engine: '' });
	expect(res.status).toBe(201);
	return res.body.id;
}

async function newDesign(client: Client, buildId: string, name: string, params: Record<string, string>) {
	const res = await client.send<{ id: string }>('POST', `/api/v1/builds/${buildId}/designs`, { name, params, message: 'as drawn' });
	expect(res.status).toBe(201);
	return res.body.id;
}

async function pdfOf(res: Response, name: string) {
	expect(res.status).toBe(200);
	expect(res.headers.get('content-type')).toBe('application/pdf');
	const file = join(dir, name);
	writeFileSync(file, new Uint8Array(await res.arrayBuffer()));
	return {
		text: execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }),
		bbox: execFileSync('pdftotext', ['-bbox', file, '-'], { encoding: 'utf8' }),
		info: execFileSync('pdfinfo', [file], { encoding: 'utf8' }),
		disposition: res.headers.get('content-disposition') ?? ''
	};
}

type Word = { text: string; x0: number; x1: number; y0: number };
const words = (bbox: string): Word[] =>
	[...bbox.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="[\d.]+">([^<]*)<\/word>/g)].map((m) => ({
		x0: Number(m[1]),
		y0: Number(m[2]),
		x1: Number(m[3]),
		text: m[4]!
	}));

/** The distance, pt, between the centres of the labels `from` and `to` on one line of a bar whose labels run `labels` in order. */
function barSpan(bbox: string, labels: string[]): number {
	const all = words(bbox);
	for (const start of all.filter((w) => w.text === labels[0])) {
		const row = all.filter((w) => Math.abs(w.y0 - start.y0) < 0.5 && w.x0 >= start.x0 - 0.1).sort((p, q) => p.x0 - q.x0);
		if (row.length >= labels.length && labels.every((l, i) => row[i]!.text === l)) {
			const last = row[labels.length - 1]!;
			return (last.x0 + last.x1) / 2 - (start.x0 + start.x1) / 2;
		}
	}
	throw new Error(`no bar labelled ${labels.join(' ')}`);
}

/** 1 mm in PDF points: 72 pt per inch (ISO 32000-1), 25.4 mm per inch. */
const PT_PER_MM = 72 / 25.4;

describe('the shop drawing of a cutting package', () => {
	let me: Awaited<ReturnType<typeof owner>>;
	let buildId: string;
	let designId: string;
	const drawing = (query: Record<string, string>, client: Client = me.client) =>
		client.get(`/api/v1/builds/${buildId}/cutting-packages/drawing.pdf?${new URLSearchParams(query)}`);

	beforeAll(async () => {
		me = await owner('drawing');
		buildId = await newBuild(me.client, 'Drawing bench');
		designId = await newDesign(me.client, buildId, 'Keyed crank wheel', keyed);
	});

	it('previews every dimension from the design and the key standard before anything is sent', async () => {
		const pdf = await pdfOf(await drawing({ designId, quantity: '3', finish: 'zinc plated' }), 'keyed.pdf');
		const t = pdf.text;
		expect(t).toContain('Shop drawing: Keyed crank wheel, revision 1');
		expect(t).toContain('Ø100.00'); // the design's OD
		// Root circle = OD − 2 × tooth depth = 100 − 2 × 5 (the design's values).
		expect(t).toContain('Ø90.00 root');
		// DIN 6885-1, shaft over 17 up to 22 mm: key 6 x 6, hub t2 = 2.8 mm (published DIN 6885 extract);
		// the hub dimension over the bore is d + t2 = 20 + 2.8.
		expect(t).toContain('Keyway 6.00 wide, d + t2 = 22.80');
		// ISO 286: 20 mm lies in "over 18 up to 30", IT7 = 21 µm; H7's lower deviation is 0 (from memory).
		expect(t).toContain('Bore Ø20.00 H7 (+0.021 / 0)');
		expect(t).toContain('Bolt holes: 4 × Ø6.50 on PCD 60.00');
		expect(t).toContain('Balance holes: 2 × Ø5.00 on PCD 76.00');
		// 36-1 at duty 0.5: the gap opens at tooth 34's trailing edge (345°) and closes at tooth 0's leading
		// edge (360°), centre 352.5°; from a keyway at 90° that is 262.5° of rotation, which on a wheel
		// turning clockwise lies counter-clockwise on its face: 97.5° the other way (worked by hand).
		expect(t).toContain('Gap centre 97.5° clockwise from keyway centre line, 15° open');
		expect(t).toContain('ISO 2768-m');
		expect(t).toMatch(/Material\s+Thickness\s+Quantity\s+Finish/);
		expect(t).toMatch(/Mild steel\s+3\.00 mm\s+3 off\s+zinc plated/);
		expect(t).toMatch(/Revision[\s\S]*?\n\s*Keyed crank wheel\s+Drawing bench\s+1\s+\d{4}-\d{2}-\d{2}/);
		expect(t).toContain('wheel-36-1-100mm-r1.dxf');
		// The cautions stay (read across the notes' line breaks).
		const flat = t.replace(/\s+/g, ' ');
		expect(flat).toContain('Deburr all edges: cut parts are sharp.');
		expect(flat).toContain('A missing-tooth wheel is out of balance by design; check it before running at speed.');
		expect(pdf.disposition).toContain('cutting-spec-36-1-100mm-r1.pdf');

		// To scale: 1:1 on A4 (ISO 216: 210 x 297 mm = 595.28 x 841.89 pt), and the 100 mm calibration
		// bar's end labels 100 mm apart on the page.
		expect(t).toMatch(/Scale 1:1/);
		expect(t).toMatch(/1:1 on A4/);
		const [, w, h] = /Page size:\s+([\d.]+) x ([\d.]+) pts \(A4\)/.exec(pdf.info)!;
		expect(Number(w)).toBeCloseTo((210 / 25.4) * 72, 2);
		expect(Number(h)).toBeCloseTo((297 / 25.4) * 72, 2);
		const labels = ['0', '10', '20', '30', '40', '50', '60', '70', '80', '90', '100'];
		expect(barSpan(pdf.bbox, labels)).toBeCloseTo(100 * PT_PER_MM, 0);
	});

	it('draws a wheel too large for the paper at a reduced scale, with a scale bar of the part’s millimetres', async () => {
		const big = await newDesign(me.client, buildId, 'Big wheel', {
			units: 'mm',
			teeth: '60',
			missing: '2',
			od: '250',
			depth: '6',
			thickness: '4',
			bore: '30',
			paper: 'letter'
		});
		const pdf = await pdfOf(await drawing({ designId: big, quantity: '1' }), 'big.pdf');
		expect(pdf.text).toMatch(/Scale 1:[25]/);
		const factor = /Scale 1:(\d+)/.exec(pdf.text)![1]!;
		// ANSI Letter, 8.5 x 11 in = 612 x 792 pt.
		expect(pdf.info).toMatch(/Page size:\s+612 x 792 pts \(letter\)/);
		// The scale bar: 100 mm of the part between its end labels, 100 / factor mm on the page.
		expect(pdf.text).toContain(`mm of the part at 1:${factor}`);
		// Its labels are the only line with a "0" and a "100" and nothing between (the calibration bar has 10 … 90).
		const all = words(pdf.bbox);
		const line = all
			.filter((w) => w.text === '0')
			.map((zero) => all.filter((w) => Math.abs(w.y0 - zero.y0) < 0.5).sort((p, q) => p.x0 - q.x0))
			.find((row) => row.length === 2 && row[0]!.text === '0' && row[1]!.text === '100');
		expect(line).toBeDefined();
		const [zero, hundred] = line!;
		expect((hundred!.x0 + hundred!.x1) / 2 - (zero!.x0 + zero!.x1) / 2).toBeCloseTo((100 / Number(factor)) * PT_PER_MM, 0);
	});

	it('refuses bad details with 400 naming the field, an unknown revision with 404', async () => {
		const bad = await drawing({ designId, quantity: '0', finish: 'two\nlines' });
		expect(bad.status).toBe(400);
		const body = (await bad.json()) as { errors: Record<string, string>; refusals: { field: string }[] };
		expect(Object.keys(body.errors).sort()).toEqual(['finish', 'quantity']);
		const noDesign = await drawing({ designId: 'nope', quantity: '1' });
		expect(noDesign.status).toBe(400);
		expect(Object.keys(((await noDesign.json()) as { errors: object }).errors)).toEqual(['designId']);
		const noRevision = await drawing({ designId, quantity: '1', revision: '99' });
		expect(noRevision.status).toBe(404);
		expect(((await noRevision.json()) as { message: string }).message).toMatch(/^revision: /);
	});

	it('lets a viewer preview, and a stranger finds nothing', async () => {
		const viewerEmail = freshEmail('drawing-viewer');
		expect(await me.client.action('/workshop', 'invite', { email: viewerEmail, role: 'viewer' })).toMatchObject({ type: 'success' });
		const mail = await mailTo(viewerEmail, 'Invitation');
		const viewer = await signUp('viewer', viewerEmail);
		expect(await viewer.action(new URL(mail.link).pathname, '', {})).toMatchObject({ type: 'redirect' });
		expect((await drawing({ designId, quantity: '1' }, viewer)).status).toBe(200);
		const stranger = await owner('drawing-stranger');
		expect((await drawing({ designId, quantity: '1' }, stranger.client)).status).toBe(404);
	});

	it('sends the package with a copy to the sender, and the sent drawing downloads again', async () => {
		const to = freshEmail('drawing-fabricator');
		const res = await me.client.send<{ id: string; files: string[] }>('POST', `/api/v1/builds/${buildId}/cutting-packages`, {
			designId,
			to,
			quantity: 2,
			finish: 'black oxide'
		});
		expect(res.status).toBe(201);
		const order = await mailTo(to, 'Cutting order');
		expect(order.text).toContain('Finish: “black oxide”');
		const copy = await mailTo(me.email, 'Copy: Cutting order');
		expect(copy.text).toContain(`went to ${to}`);
		expect(copy.text).toContain('Quantity: 2');
		// Every link from the configured origin (APP_URL is ORIGIN in the test profile).
		expect(copy.link).toBe(`${new URL(appUrl).origin}/builds/${buildId}`);
		const list = (await (await fetch(`${process.env.MAILBOX_URL}/messages?to=${encodeURIComponent(me.email)}`)).json()) as {
			subject: string;
			attachments: { filename: string }[];
		}[];
		expect(list.find((m) => m.subject.startsWith('Copy: '))!.attachments.map((a) => a.filename)).toEqual(res.body.files);

		const again = await pdfOf(await me.client.get(`/api/v1/builds/${buildId}/cutting-packages/${res.body.id}/drawing.pdf`), 'sent.pdf');
		expect(again.text).toMatch(/2 off\s+black oxide/);
		expect(again.text).toContain('d + t2 = 22.80');
		expect((await me.client.get(`/api/v1/builds/${buildId}/cutting-packages/not-a-uuid/drawing.pdf`)).status).toBe(404);
	});
});
