// The phasing check's clocking written into the build's wheel design (issue 16): the page offers it
// only to those who may write, and the write is the revision path's, with its role check and its
// stale-base refusal. Against the real database and built server.
import { beforeAll, describe, expect, it } from 'vitest';
import { Client, freshEmail, mailTo, signUp } from '../support/client';

type Revision = { number: number; params: Record<string, string>; message: string };

// A 36-1, 100 mm wheel with a custom keyway at 0° (sizes from tests/integration/wheel-label.test.ts).
const keyed = {
	units: 'mm',
	teeth: '36',
	missing: '1',
	od: '100',
	depth: '5',
	thickness: '3',
	bore: '20',
	keyway: 'custom',
	keyWidth: '6',
	keyDepth: '2.8',
	keywayAngle: '0'
};

// Tooth 9 at the sensor at TDC on a 36-1 gives 90° BTDC now; 60° wanted, the key 30° of wheel
// before the sensor. By the geometry in design.md (a wheel angle counts up in the order points reach
// the sensor): tooth 0 must have passed the sensor 60° before TDC, so the point at the sensor at TDC
// is 60° past it and the key, 30° further on, sits at 60 + 30 = 90° from tooth 0's leading edge.
const check = 'teeth=36&missing=1&toothAtTdc=9&target=60&keyFromSensor=30';
const expectedKeyway = '90';

describe('applying the clocking to the build’s wheel design', () => {
	let owner: Client;
	let viewer: Client;
	let buildId: string;
	let designId: string;

	beforeAll(async () => {
		owner = await signUp('Clocking owner', freshEmail('clock-owner'));
		const build = await owner.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Clocked twin', engine: '' });
		expect(build.status).toBe(201);
		buildId = build.body.id;
		const design = await owner.send<{ id: string }>('POST', `/api/v1/builds/${buildId}/designs`, {
			name: 'Crank wheel',
			params: keyed,
			message: 'as drawn'
		});
		expect(design.status).toBe(201);
		designId = design.body.id;

		const email = freshEmail('clock-viewer');
		expect(await owner.action('/workshop', 'invite', { email, role: 'viewer' })).toMatchObject({ type: 'success' });
		const mail = await mailTo(email, 'Invitation');
		viewer = await signUp('viewer', email);
		expect(await viewer.action(new URL(mail.link).pathname, '', {})).toMatchObject({ type: 'redirect' });
	});

	/** The page's words as a reader sees them: tags (and Svelte's comment markers) out, spaces squashed. */
	const words = async (client: Client, path: string) =>
		(await (await client.get(path)).text())
			.replace(/<!--[\s\S]*?-->/g, '')
			.replace(/<[^>]+>/g, ' ')
			.replace(/\s+/g, ' ');

	async function revisions(): Promise<Revision[]> {
		const res = await owner.json<{ revisions: Revision[] }>(`/api/v1/designs/${designId}`);
		expect(res.status).toBe(200);
		return res.body.revisions;
	}

	it('offers the button to the owner, on the build’s first design, and not to a viewer', async () => {
		const own = await words(owner, `/phasing?build=${buildId}&${check}`);
		expect(own).toContain('Apply to Crank wheel');
		expect(own).toMatch(new RegExp(`set the keyway angle to ${expectedKeyway} ?°`));
		expect(own).toMatch(/Writes revision 2 of “Crank wheel”: the keyway from 0 ?° to 90 ?°/);
		const seen = await words(viewer, `/phasing?build=${buildId}&design=${designId}&${check}`);
		expect(seen).toContain('Tooth at the sensor at TDC');
		expect(seen).not.toContain('Apply to Crank wheel');
		expect(seen).toMatch(/your role in the workshop is viewer/);
	});

	it('refuses a viewer’s write (403) and writes nothing', async () => {
		const head = (await revisions())[0]!;
		const res = await viewer.send<{ message: string }>('POST', `/api/v1/designs/${designId}/revisions`, {
			baseRevision: head.number,
			params: { ...head.params, keywayAngle: expectedKeyway },
			message: `Keyway clocked to ${expectedKeyway}° from the phasing check: first tooth 60° BTDC`
		});
		expect(res.status).toBe(403);
		expect((await revisions()).map((r) => r.number)).toEqual([1]);
	});

	it('writes the keyway on the head, then answers 409 to a second write from the same base', async () => {
		const head = (await revisions())[0]!;
		const body = {
			baseRevision: head.number,
			params: { ...head.params, keywayAngle: expectedKeyway },
			message: `Keyway clocked to ${expectedKeyway}° from the phasing check: first tooth 60° BTDC`
		};
		const first = await owner.send<{ revision: Revision }>('POST', `/api/v1/designs/${designId}/revisions`, body);
		expect(first.status).toBe(201);
		expect(first.body.revision).toMatchObject({ number: 2, params: { ...keyed, keywayAngle: expectedKeyway } });
		const again = await owner.send<{ code: string; head: Revision }>('POST', `/api/v1/designs/${designId}/revisions`, body);
		expect(again.status).toBe(409);
		expect(again.body).toMatchObject({ code: 'stale', head: { number: 2 } });
		expect((await revisions()).map((r) => r.number)).toEqual([2, 1]);
		// The page opened now reads revision 2: nothing left to apply.
		const html = await words(owner, `/phasing?build=${buildId}&${check}`);
		expect(html).not.toContain('Apply to Crank wheel');
		expect(html).toMatch(/has its keyway at 90 ?° in revision 2 ?: nothing to apply/);
	});
});
