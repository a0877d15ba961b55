import { json } from '@sveltejs/kit';
import { cuttingPackageInput } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { jsonBody } from '$lib/server/api';
import { listAnswer } from '$lib/server/build-list-route';
import { getBuild } from '$lib/server/builds';
import { revisionToCut, sendCuttingPackage } from '$lib/server/cutting-package';
import { db } from '$lib/server/db';
import { mailRefusal, reserveMail } from '$lib/server/mail-throttle';

/** The newest 50 packages sent, or the 50 after `cursor`; `next` gives the page after. */
export async function GET(event) {
	return listAnswer(event, 'cuttingPackages');
}

/** E-mails a fabricator (and a copy to the sender) the DXF and the shop drawing of a design's revision (the newest unless `revision` is given). */
export async function POST(event) {
	const access = await objectAccess(event, 'edit', 'build', event.params.buildId);
	const body = await jsonBody(event.request, cuttingPackageInput);
	if (!body.ok) return body.response;
	const { design, revision, wheel } = await revisionToCut(db(), access.buildId, body.data.designId, body.data.revision);
	const build = (await getBuild(db(), access.buildId))!;
	const allowed = await reserveMail(db(), 'cutting-package', {
		address: body.data.to,
		client: event.getClientAddress(),
		workshopId: access.workshop.id
	});
	if (!allowed.ok)
		return json(
			{ message: mailRefusal(allowed), code: 'throttled' },
			{ status: 429, headers: { 'retry-after': String(allowed.retryAfterS) } }
		);
	try {
		const sent = await sendCuttingPackage(db(), {
			build,
			design,
			revision,
			wheel,
			to: body.data.to,
			quantity: body.data.quantity,
			notes: body.data.notes,
			finish: body.data.finish,
			sender: access.user
		});
		return json({ ...sent, revision, to: body.data.to }, { status: 201 });
	} catch (err) {
		const reason = err instanceof Error ? err.message : String(err);
		// The mail server refused or was unreachable: nothing was recorded; say so rather than 500.
		if (/ECONNREFUSED|ETIMEDOUT|EENVELOPE|EAUTH|EMESSAGE|ESOCKET|ECONNECTION/.test(`${(err as { code?: string }).code} ${reason}`)) {
			return json(
				{
					message: `The mail server did not take the message (${reason}); nothing was sent or recorded. Try again later.`,
					code: 'mail-failed'
				},
				{ status: 502 }
			);
		}
		throw err;
	}
}
