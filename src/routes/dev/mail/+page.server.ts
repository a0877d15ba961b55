import { error } from '@sveltejs/kit';
import { listMailbox, mailboxUrl } from '$lib/server/mailbox';

// The local mailbox exists only where the scripts started the SMTP fake; elsewhere this page is not there.
function requireMailbox() {
	const url = mailboxUrl();
	if (!url) error(404, 'Not found');
	return url;
}

export async function load({ fetch }) {
	requireMailbox();
	return { messages: await listMailbox(fetch) };
}

export const actions = {
	clear: async ({ fetch }) => {
		await fetch(`${requireMailbox()}/messages`, { method: 'DELETE' });
		return { cleared: true };
	}
};
