// The build sheet, whole: from a saved build (engine profile, a wheel with keyway, bolt circle,
// balance holes and label, a TDC record, a degree tape) and signed out from the same wheel query,
// read back with poppler's pdftotext. Expected values are typed here from their sources: the
// DIN 6885-1 row, the pattern's geometry (design.md), the balance from tests/support/gap-balance.ts
// and the sides and distances from the turning-engine model (tests/support/turning-engine.ts).
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { freshEmail, signUp, type Client } from '../support/client';
import { angleOf, gapMoment, holesMoment, keywayMoment, length, permissibleGmm, sum, toothArea } from '../support/gap-balance';
import { sideOf, underPointer } from '../support/turning-engine';

const app = process.env.APP_URL!;
const dir = mkdtempSync(join(tmpdir(), 'phasewright-sheet-'));

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

/** A row of the sheet as pdftotext lays it out: its key, then its value (continuation lines joined). */
function rowOf(text: string, key: string): string {
	const lines = text.split('\n');
	const i = lines.findIndex((l) => l.trimStart().startsWith(key + ' '));
	expect(i, `a "${key}" row`).toBeGreaterThanOrEqual(0);
	const start = lines[i]!.indexOf(key) + key.length;
	const col = lines[i]!.length - lines[i]!.slice(start).trimStart().length;
	let value = lines[i]!.slice(col).trim();
	// Continuation lines start at the value column with nothing in the key column.
	for (let j = i + 1; j < lines.length && lines[j]!.slice(0, col).trim() === '' && lines[j]!.trim() !== ''; j++)
		value += ' ' + lines[j]!.trim();
	return value;
}

/** The sheet's Wheel section, heading to the next heading. */
const wheelSection = (text: string) => text.slice(text.indexOf('\nWheel\n'), text.indexOf('\nEngine\n'));

// A 24-2 steel wheel, 120 mm over the tips, 5 mm teeth, a 25 mm bore with a DIN 6885-1 key.
const od = 120;
const depth = 5;
const bore = 25;
// DIN 6885-1, shafts over 22 to 30 mm: key 8 x 7, hub depth t2 = 3.3 mm (the standard's table).
const din = { b: 8, h: 7, t2: 3.3 };
const wheelShape = { teeth: 24, missing: 2, odMm: od, depthMm: depth, duty: 0.5 };

// Balance holes worked out here, not by the app: two 9 mm holes 40° apart, opposite what the gap and
// the keyway (at 0°) take away, on the pitch circle that cancels it, rounded as a person types them.
const taken = sum(gapMoment(wheelShape), keywayMoment(bore, din.b, din.t2, 0).moment);
const hole = 9;
const spacing = 40;
const holeArea = (Math.PI * hole * hole) / 4;
const across = (180 + angleOf(taken)) % 360;
const balancePcd = Math.round(((2 * length(taken)) / (2 * holeArea * Math.cos((spacing / 2) * (Math.PI / 180)))) * 100) / 100;
const firstHole = Math.round((across - spacing / 2) * 100) / 100;

const wheel: Record<string, string> = {
	units: 'mm',
	teeth: '24',
	missing: '2',
	od: String(od),
	depth: String(depth),
	thickness: '3',
	bore: String(bore),
	keyway: 'din6885',
	shaft: '25',
	keywayAngle: '0',
	bolts: '3',
	pcd: '60',
	boltHole: '6',
	balanceCount: '2',
	balancePcd: String(balancePcd),
	balanceHole: String(hole),
	balanceAngle: String(firstHole),
	balanceSpacing: String(spacing),
	mark: '90',
	label: 'PW 7'
};
const engine = { toothAtTdc: '4', layout: 'twin-270' };

describe('the balance the test wheel is given (the oracle, before the app sees it)', () => {
	it('cancels the gap and the keyway within a small share of what ISO 21940-11 allows', () => {
		const residual = length(sum(taken, holesMoment(hole, balancePcd, [firstHole, firstHole + spacing])));
		// Mass: the root disc plus 22 teeth, less bore, keyway, 3 bolt holes and the 2 balance holes; steel 7.85 g/cm³ (handbook).
		const areaMm2 =
			Math.PI * (od / 2 - depth) ** 2 +
			22 * toothArea(wheelShape) -
			Math.PI * (bore / 2) ** 2 -
			keywayMoment(bore, din.b, din.t2, 0).areaMm2 -
			3 * Math.PI * 9 -
			2 * holeArea;
		const gPerMm2 = 7.85e-3 * 3;
		const allowed = permissibleGmm(6.3, (areaMm2 * gPerMm2) / 1000, 8000);
		expect(residual * gPerMm2).toBeLessThan(0.1 * allowed);
		// And without the holes the wheel would be well over it: the holes are doing the work.
		expect(length(taken) * gPerMm2).toBeGreaterThan(10 * allowed);
	});
});

describe('the build sheet of a build with the whole wheel', () => {
	let me: Client;
	let buildId: string;
	let fromBuild: string;
	beforeAll(async () => {
		me = await signUp('Sheet whole owner', freshEmail('sheet-whole'));
		const build = await me.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Whole sheet 270 twin', engine: '' });
		expect(build.status).toBe(201);
		buildId = build.body.id;
		// The profile was set up at 36-1 before the wheel was drawn: the sheet must follow the wheel.
		expect(
			(await me.send('PUT', `/api/v1/builds/${buildId}/engine`, { params: { teeth: '36', missing: '1', ...engine } })).status
		).toBeLessThan(300);
		const design = await me.send('POST', `/api/v1/builds/${buildId}/designs`, { name: 'Crank wheel', params: wheel, message: 'balanced' });
		expect(design.status, JSON.stringify(design.body)).toBe(201);
		expect((await me.send('POST', `/api/v1/builds/${buildId}/tdc-records`, { params: { a: '-14', b: '15' } })).status).toBeLessThan(300);
		const tape = await me.send('POST', `/api/v1/builds/${buildId}/tapes`, {
			label: 'hub',
			params: { diameter: '150', rotation: 'cw', timing: 'base:10' }
		});
		expect(tape.status, JSON.stringify(tape.body)).toBeLessThan(300);
		fromBuild = await pdfText(await me.get(`/api/v1/builds/${buildId}/build-sheet.pdf`), 'from-build.pdf');
	});

	it('prints every feature of the wheel as typed, none of them "none"', () => {
		const text = fromBuild;
		expect(rowOf(text, 'Pattern')).toMatch(/^24-2, 22 teeth, pitch 15°/);
		expect(rowOf(text, 'Keyway')).toContain(`${din.b}.00 mm wide, ${din.t2.toFixed(2)} mm deep at 0°`);
		expect(rowOf(text, 'Keyway')).toContain(`DIN 6885-1 key ${din.b} x ${din.h}`);
		expect(rowOf(text, 'Bolt holes')).toBe('3 x 6.00 mm on 60.00 mm PCD from 0°');
		expect(rowOf(text, 'Balance holes')).toContain(`2 x 9.00 mm on ${balancePcd.toFixed(2)} mm PCD`);
		expect(rowOf(text, 'Balance hole spacing')).toContain('40°');
		expect(rowOf(text, 'Label')).toBe('"PW 7"');
		expect(rowOf(text, 'Shaft (key looked up by)')).toBe('25 mm');
		for (const key of ['Keyway', 'Bolt holes', 'Balance holes', 'Label']) expect(rowOf(text, key)).not.toBe('none');
		// Every saved parameter, as typed.
		const given = rowOf(text, 'Parameters as given').replace(/\s+/g, ' ');
		for (const [name, value] of Object.entries(wheel)) if (name !== 'units') expect(given).toContain(`${name}=${value}`);
	});

	it('gives no unbalance warning for holes that balance it', () => {
		expect(fromBuild).not.toMatch(/Unbalance [\d.]+ g·mm exceeds/);
		expect(rowOf(fromBuild, 'Residual unbalance')).toMatch(/^within ISO 21940-11 G 6\.3/);
	});

	it('checks the phasing on the wheel’s own 24-2, not the profile’s 36-1', () => {
		// 24 positions: pitch 360/24 = 15°; the gap is positions 22 and 23 (design.md: tooth 0 is the first after it).
		expect(rowOf(fromBuild, 'Pitch, resolution')).toBe('15° of wheel, 15 crank degrees per tooth');
		expect(rowOf(fromBuild, 'Gaps in the pattern')).toBe('1: missing positions 22–23');
		// Tooth 4 at the sensor at TDC: 4 × 15 = 60° BTDC (geometry).
		expect(rowOf(fromBuild, 'First-tooth offset')).toMatch(/^60° BTDC: the angle to enter in your ECU/);
		// A 270° twin: cylinder 2 at 270° (common practice).
		expect(rowOf(fromBuild, 'Cylinder TDCs')).toContain('cyl 2 at 270°');
		expect(fromBuild).not.toMatch(/36-1|pitch 10°/);
	});

	it('prints the TDC record with sides, the tape with its direction of travel and the card’s rows', () => {
		// Marks at 14° BTDC and 15° ATDC: TDC half-way, 0.5° ATDC of the scale's 0 (piston-stop rule, common practice).
		expect(rowOf(fromBuild, 'Piston-stop marks')).toMatch(/^14° BTDC and 15° ATDC: true TDC 0\.5° ATDC/);
		const engineModel = { hubDiameterMm: 150, paperThicknessMm: 0.1, rotation: 'cw' as const };
		// mm per degree on the paper's mid-thickness: π·150.1/360 (s = r·θ).
		const perDeg = (Math.PI * 150.1) / 360;
		expect(rowOf(fromBuild, 'Degree tape')).toContain(`hub 150.00 mm, ${perDeg.toFixed(2)} mm per degree`);
		// Before TDC the tape brings its BTDC side to the pointer first: the tape moves toward that side.
		const btdcSide = sideOf(underPointer(engineModel, -10));
		expect(rowOf(fromBuild, 'Direction of travel')).toContain(
			`the tape moves ${btdcSide === 'right' ? 'left to right' : 'right to left'} past the pointer`
		);
		// Cylinder 2's TDC comes 270° after cylinder 1's: where the turning engine has the tape then.
		const cyl2 = underPointer(engineModel, 270);
		expect(rowOf(fromBuild, 'Marks on the tape')).toContain(`cyl 2 TDC (90° BTDC): ${Math.abs(cyl2).toFixed(2)} mm ${sideOf(cyl2)} of TDC`);
		const base = underPointer(engineModel, -10);
		expect(rowOf(fromBuild, 'base')).toBe(`10° BTDC: ${Math.abs(base).toFixed(2)} mm ${sideOf(base)} of TDC`);
	});

	it('the signed-out sheet from the same wheel query prints the same wheel rows', async () => {
		const res = await fetch(
			`${app}/api/v1/build-sheet.pdf?${new URLSearchParams({ ...wheel, ...engine, buildName: 'Whole sheet 270 twin' })}`
		);
		const signedOut = await pdfText(res, 'signed-out.pdf');
		const rows = (t: string) =>
			wheelSection(t)
				.split('\n')
				.map((l) => l.trimEnd())
				.filter(Boolean);
		expect(rows(signedOut).length).toBeGreaterThan(15);
		expect(rows(signedOut)).toEqual(rows(fromBuild));
	});
});
