import { fail } from '@sveltejs/kit';
import { resetRequest } from '$lib/schemas/account';
import { parseForm } from '$lib/schemas/form';
import { createPasswordReset } from '$lib/server/accounts';
import { db } from '$lib/server/db';
import { sendMail } from '$lib/server/mail';
import { queueMail } from '$lib/server/mail-queue';
import { mailRefusal, reserveMail } from '$lib/server/mail-throttle';
import { passwordResetMessage } from '$lib/server/messages';
import { linkTo } from '$lib/server/origin';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async (event) => {
		const form = await event.request.formData();
		const parsed = parseForm(resetRequest, form);
		if (!parsed.ok) return fail(400, { email: String(form.get('email') ?? ''), errors: parsed.errors });
		const { email } = parsed.data;
		const allowed = await reserveMail(db(), 'reset', { address: email, client: event.getClientAddress() });
		if (!allowed.ok) return fail(429, { email, message: mailRefusal(allowed) });
		// The same answer, after the same work, whether or not the address has an account (mail-queue.ts).
		queueMail(async () => {
			const reset = await createPasswordReset(db(), email);
			if (reset) await sendMail(passwordResetMessage(reset.user.email, linkTo(`/reset/${reset.token}`)));
		});
		return { sent: true, email };
	}
};
