// A signal check kept in a build: saved through the API (checked again by the server, never half
// saved), listed in the build, logged, and its sync margins printed on the build sheet (read back
// with poppler's pdftotext, as build-sheet.test.ts reads it).
//
// The oracle is geometry (common practice): at a steady speed every tooth space of a 36-1 is one
// pitch and the gap two, so the gap is 2.0× the space before it and an ordinary space 1.0×. With the
// detection ratio at 1.5 the gap stands 2 / 1.5 − 1 = 33.3 % above the ratio and an ordinary space
// 1 − 1 / 1.5 = 33.3 % below it: a sync margin of 33 % in every case, whatever its rpm.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { freshEmail, signUp, type Client } from '../support/client';

const dir = mkdtempSync(join(tmpdir(), 'phasewright-signal-'));

async function pdfText(res: Response, name: string): Promise<string> {
	expect(
		res.status,
		await res
			.clone()
			.text()
			.catch(() => '')
	).toBe(200);
	const file = join(dir, name);
	writeFileSync(file, Buffer.from(await res.arrayBuffer()));
	return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
}

/** Lines of the sheet's Signal check section, spaces squeezed. */
const signalSection = (text: string) =>
	text
		.slice(text.indexOf('\nSignal check\n'), text.indexOf('\nWarnings outstanding\n'))
		.split('\n')
		.map((l) => l.replace(/\s+/g, ' ').trim())
		.filter(Boolean);

const wheel = { units: 'mm', teeth: '36', missing: '1', od: '120', depth: '5', thickness: '3', bore: '25' };
const engine = { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'single-4' };

/** Steady speeds: no swing, no acceleration, so the geometry above is the whole answer. */
const steady = {
	...engine,
	ratio: '1.5',
	cranking: '250',
	crankingSwing: '0',
	crankingAccel: '0',
	idleRpm: '1000',
	idleSwing: '0',
	idleAccel: '0',
	freeRevRpm: '4000',
	freeRevSwing: '0',
	freeRevAccel: '0',
	rpm: '8000',
	revLimitSwing: '0',
	revLimitAccel: '0'
};

type Saved = { id: string; cases: { name: string; rpm: number; marginPct: number; verdict: string }[] };
type Overview = {
	signalChecks: { id: string; label: string; params: Record<string, string>; cases: Saved['cases'] }[];
	activity: { kind: string; summary: string }[];
};

describe('a signal check kept in a build', () => {
	let me: Client;
	let buildId: string;
	beforeAll(async () => {
		me = await signUp('Signal owner', freshEmail('signal-owner'));
		const build = await me.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Signal single', engine: '' });
		expect(build.status).toBe(201);
		buildId = build.body.id;
		expect((await me.send('PUT', `/api/v1/builds/${buildId}/engine`, { params: engine })).status).toBeLessThan(300);
		expect((await me.send('POST', `/api/v1/builds/${buildId}/designs`, { name: 'Crank wheel', params: wheel })).status).toBe(201);
	});

	it('refuses a bad ratio with the field named and saves nothing', async () => {
		const res = await me.send<{ refusals: { field: string; message: string }[] }>('POST', `/api/v1/builds/${buildId}/signal-checks`, {
			params: { ...steady, ratio: 'lots' }
		});
		expect(res.status).toBe(400);
		expect(res.body.refusals.map((r) => r.field)).toContain('params.ratio');
		const overview = (await me.json<Overview>(`/api/v1/builds/${buildId}`)).body;
		expect(overview.signalChecks).toEqual([]);
		expect(overview.activity.filter((a) => a.kind === 'signal')).toEqual([]);
	});

	it('saves the parameters and each case’s sync margin, worked out by the server', async () => {
		const res = await me.send<Saved>('POST', `/api/v1/builds/${buildId}/signal-checks`, { label: 'steady', params: steady });
		expect(res.status, JSON.stringify(res.body)).toBe(201);
		expect(res.body.cases.map((c) => [c.rpm, Math.round(c.marginPct), c.verdict])).toEqual([
			[250, 33, 'safe'],
			[1000, 33, 'safe'],
			[4000, 33, 'safe'],
			[8000, 33, 'safe']
		]);
		const overview = (await me.json<Overview>(`/api/v1/builds/${buildId}`)).body;
		expect(overview.signalChecks).toHaveLength(1);
		expect(overview.signalChecks[0]).toMatchObject({ label: 'steady', params: { ratio: '1.5', cranking: '250' } });
		expect(overview.activity.find((a) => a.kind === 'signal')?.summary).toMatch(/^Signal check “steady”: every speed case finds the gap/);
	});

	it('prints the newest check’s sync margin per case on the build sheet', async () => {
		// A second, newer check with a tighter rule: 2 / 1.8 − 1 = 11.1 % above, 1 − 1 / 1.8 = 44.4 % below: 11 %, tight.
		const newer = await me.send<Saved>('POST', `/api/v1/builds/${buildId}/signal-checks`, {
			label: 'tight rule',
			params: { ...steady, ratio: '1.8' }
		});
		expect(newer.status, JSON.stringify(newer.body)).toBe(201);
		const text = await pdfText(await me.get(`/api/v1/builds/${buildId}/build-sheet.pdf`), 'signal-sheet.pdf');
		const lines = signalSection(text);
		expect(lines[0]).toBe('Signal check');
		expect(lines[1]).toMatch(/^Saved “tight rule”, \d{4}-\d{2}-\d{2}$/);
		expect(lines.slice(2)).toEqual([
			'Cranking, 250 rpm sync margin 11%: tight',
			'Idle, 1000 rpm sync margin 11%: tight',
			'Free rev, 4000 rpm sync margin 11%: tight',
			'Rev limit, 8000 rpm sync margin 11%: tight'
		]);
	});

	it('removes a check, logged, and the sheet goes back to the one before', async () => {
		const overview = (await me.json<Overview>(`/api/v1/builds/${buildId}`)).body;
		const newest = overview.signalChecks[0]!;
		expect(newest.label).toBe('tight rule');
		expect((await me.send('DELETE', `/api/v1/builds/${buildId}/signal-checks/${newest.id}`)).status).toBe(204);
		const after = (await me.json<Overview>(`/api/v1/builds/${buildId}`)).body;
		expect(after.signalChecks.map((c) => c.label)).toEqual(['steady']);
		expect(after.activity[0]).toMatchObject({ kind: 'signal', summary: 'Signal check “tight rule” removed' });
		const text = await pdfText(await me.get(`/api/v1/builds/${buildId}/build-sheet.pdf`), 'signal-sheet-2.pdf');
		expect(signalSection(text)).toContain('Cranking, 250 rpm sync margin 33%: safe');
	});
});
