import { error, type RequestEvent } from '@sveltejs/kit';
import { listMailbox, mailboxUrl } from '$lib/server/mailbox';
import type { Actions, PageServerLoad } from './$types';

// The local mailbox exists only where the scripts run the SMTP fake, and only for this machine
// (mailbox.ts); anywhere else this page is not there.
function requireMailbox(event: RequestEvent) {
	const url = mailboxUrl(event);
	if (!url) error(404, 'Not found');
	return url;
}

export const load: PageServerLoad = async (event) => {
	return { messages: await listMailbox(requireMailbox(event), event.fetch) };
};

export const actions: Actions = {
	clear: async (event) => {
		await event.fetch(`${requireMailbox(event)}/messages`, { method: 'DELETE' });
		return { cleared: true };
	}
};
