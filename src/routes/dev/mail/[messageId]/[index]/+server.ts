import { error } from '@sveltejs/kit';
import { mailboxAttachment, mailboxUrl } from '$lib/server/mailbox';
import type { RequestHandler } from './$types';

/** Kinds a browser shows itself; anything else (an HTML part, a DXF) is downloaded, never rendered here. */
const shownInline = new Set(['application/pdf', 'image/png', 'image/jpeg', 'text/plain']);

/** One attachment of a message in the local mailbox (the DXF and spec of a cutting package, say). */
export const GET: RequestHandler = async (event) => {
	const base = mailboxUrl(event);
	const index = Number(event.params.index);
	if (!base || !Number.isInteger(index) || index < 0) error(404, 'Not found');
	const found = await mailboxAttachment(base, event.params.messageId, index, event.fetch);
	if (!found) error(404, 'Not found');
	const type = found.contentType.split(';')[0]!.trim().toLowerCase();
	const disposition = shownInline.has(type) ? 'inline' : 'attachment';
	return new Response(new Uint8Array(found.bytes), {
		headers: {
			'content-type': shownInline.has(type) ? found.contentType : 'application/octet-stream',
			'content-disposition': `${disposition}; filename*=UTF-8''${encodeURIComponent(found.filename)}`,
			'cache-control': 'no-store'
		}
	});
};
