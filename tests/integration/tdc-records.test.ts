// A build's TDC records keep the readings with their sides and scale; records saved before they
// did are migrated (drizzle/0005_tdc_readings_with_sides.sql) with their signed meaning kept.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { eq, inArray, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrationsFolder } from '../../scripts/db';
import { connect } from '../../src/lib/server/db';
import { build, tdcRecord, workshop } from '../../src/lib/server/db/schema';
import { Client, freshEmail, signUp } from '../support/client';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

type Overview = {
	tdcRecords: { label: string; tdcDeg: string; params: Record<string, string> }[];
	activity: { kind: string; summary: string }[];
};

let client: Client;
let buildId: string;
beforeAll(async () => {
	client = await signUp('tdc records', freshEmail('tdcrecords'));
	buildId = (await client.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Piston-stop bench' })).body.id;
});

describe('saving a TDC record', () => {
	it('keeps a quadrant wheel’s readings with their quadrants and the scale, and shows them with sides on the build page', async () => {
		// Seed document: marks 29° apart, TDC 14.5° from each: 10 BTDC and 19 ATDC give 4.5 ATDC.
		const res = await client.send('POST', `/api/v1/builds/${buildId}/tdc-records`, {
			label: 'quarters',
			params: { a: '10 btdc', b: '19A', scale: 'signed' }
		});
		expect(res.status).toBe(201);
		const q = await client.send('POST', `/api/v1/builds/${buildId}/tdc-records`, {
			label: 'near BDC',
			params: { a: '20 BBDC', b: '12 ABDC', scale: 'quadrant' }
		});
		expect(q.status).toBe(201);
		const { body } = await client.json<Overview>(`/api/v1/builds/${buildId}`);
		const byLabel = Object.fromEntries(body.tdcRecords.map((r) => [r.label, r]));
		expect(byLabel.quarters).toMatchObject({ tdcDeg: '4.5', params: { a: '10 BTDC', b: '19 ATDC', scale: 'signed' } });
		// By hand: 20 BBDC = 160 ATDC, 12 ABDC = 192 ATDC; half-way 176 ATDC, i.e. 4 BBDC.
		expect(byLabel['near BDC']).toMatchObject({ tdcDeg: '176', params: { a: '20 BBDC', b: '12 ABDC', scale: 'quadrant' } });
		expect(body.activity.find((a) => a.kind === 'tdc' && a.summary.includes('quarters'))?.summary).toMatch(
			/marks 10° BTDC and 19° ATDC, TDC 4\.5° ATDC/
		);

		const page = await (await client.get(`/builds/${buildId}`)).text();
		const list = page.slice(page.indexOf('data-testid="tdc-records"'));
		expect(list).toMatch(/4\.5° ATDC<\/span> of the scale’s 0/);
		expect(list).toMatch(/10° BTDC<\/span> and <span[^>]*>19° ATDC/);
		expect(list).toMatch(/4° BBDC<\/span> of the scale’s 0/);
	});

	it('refuses ambiguous readings by field and saves nothing', async () => {
		const before = (await client.json<Overview>(`/api/v1/builds/${buildId}`)).body.tdcRecords.length;
		const plain = await client.send<{ errors: Record<string, string> }>('POST', `/api/v1/builds/${buildId}/tdc-records`, {
			params: { a: '10', b: '19' }
		});
		expect(plain.status).toBe(400);
		expect(plain.body.errors['params.b']).toMatch(/^b: both readings lie ATDC of 0.*10 BTDC and 19 ATDC/);
		const quadrant = await client.send<{ errors: Record<string, string> }>('POST', `/api/v1/builds/${buildId}/tdc-records`, {
			params: { a: '10', b: '19 ATDC', scale: 'quadrant' }
		});
		expect(quadrant.status).toBe(400);
		expect(quadrant.body.errors['params.a']).toMatch(/^a: on a 0–90–0 wheel/);
		expect((await client.json<Overview>(`/api/v1/builds/${buildId}`)).body.tdcRecords).toHaveLength(before);
	});
});

describe('the migration of records saved as plain numbers', () => {
	it('writes each reading with its side, the scale named, the signed meaning kept', async () => {
		const [shop] = await database
			.insert(workshop)
			.values({ slug: `tdc-mig-${Date.now()}`, name: 'Migration bench' })
			.returning();
		const [b] = await database.insert(build).values({ workshopId: shop!.id, name: 'Old records' }).returning();
		// Rows as the old code saved them: readings as typed, tdc_deg on the scale (0–360 on a full wheel).
		const old: { label: string; params: Record<string, string>; tdcDeg: string }[] = [
			{ label: 'signed', params: { a: '-14', b: '15' }, tdcDeg: '0.5' },
			{ label: 'full inferred', params: { a: '350', b: '20' }, tdcDeg: '5' },
			{ label: 'full named', params: { a: '10', b: '340', scale: 'full' }, tdcDeg: '355' },
			{ label: 'same side', params: { a: '5', b: '30' }, tdcDeg: '17.5' },
			{ label: 'across 180', params: { a: '170', b: '-170.5', arc: 'shorter' }, tdcDeg: '179.75' },
			{ label: 'zero', params: { a: '0', b: '12.25' }, tdcDeg: '6.125' },
			{ label: 'already sided', params: { a: '30 BBDC', b: '20 ABDC', scale: 'quadrant' }, tdcDeg: '175' }
		];
		const rows = await database
			.insert(tdcRecord)
			.values(old.map((o) => ({ ...o, buildId: b!.id })))
			.returning({ id: tdcRecord.id });
		const migration = readFileSync(join(migrationsFolder, '0005_tdc_readings_with_sides.sql'), 'utf8');
		await database.execute(sql.raw(migration));
		const after = await database
			.select({ label: tdcRecord.label, params: tdcRecord.params, tdcDeg: tdcRecord.tdcDeg })
			.from(tdcRecord)
			.where(
				inArray(
					tdcRecord.id,
					rows.map((r) => r.id)
				)
			);
		const got = Object.fromEntries(after.map((r) => [r.label, { params: r.params, tdcDeg: r.tdcDeg }]));
		// Worked by hand from the old meaning: negative = BTDC; on 0–360, 350 = 10 BTDC, 340 = 20 BTDC
		// and TDC 355 = 5 BTDC; tdc_deg becomes degrees ATDC, BTDC negative.
		expect(got).toEqual({
			signed: { params: { a: '14 BTDC', b: '15 ATDC', scale: 'signed' }, tdcDeg: '0.5' },
			'full inferred': { params: { a: '10 BTDC', b: '20 ATDC', scale: 'full' }, tdcDeg: '5' },
			'full named': { params: { a: '10 ATDC', b: '20 BTDC', scale: 'full' }, tdcDeg: '-5' },
			'same side': { params: { a: '5 ATDC', b: '30 ATDC', scale: 'signed' }, tdcDeg: '17.5' },
			'across 180': { params: { a: '170 ATDC', b: '170.5 BTDC', arc: 'shorter', scale: 'signed' }, tdcDeg: '179.75' },
			zero: { params: { a: '0', b: '12.25 ATDC', scale: 'signed' }, tdcDeg: '6.125' },
			'already sided': { params: { a: '30 BBDC', b: '20 ABDC', scale: 'quadrant' }, tdcDeg: '175' }
		});
		// Opened again in the tool, each migrated record finds the TDC it was saved with.
		const { findTdc } = await import('../../src/lib/schemas/tdc');
		for (const [label, r] of Object.entries(got)) {
			const found = findTdc(r.params as Record<string, string>);
			expect(found.ok, label).toBe(true);
			if (found.ok === true) expect(found.value.result.tdcDeg, label).toBeCloseTo(Number(r.tdcDeg), 6);
		}
		// Running it again changes nothing.
		await database.execute(sql.raw(migration));
		const again = await database
			.select({ label: tdcRecord.label, params: tdcRecord.params, tdcDeg: tdcRecord.tdcDeg })
			.from(tdcRecord)
			.where(
				inArray(
					tdcRecord.id,
					rows.map((r) => r.id)
				)
			);
		expect(Object.fromEntries(again.map((r) => [r.label, { params: r.params, tdcDeg: r.tdcDeg }]))).toEqual(got);
		await database.delete(workshop).where(eq(workshop.id, shop!.id));
	});
});
