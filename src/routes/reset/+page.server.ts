import { fail } from '@sveltejs/kit';
import { resetRequest } from '$lib/schemas/account';
import { parseForm } from '$lib/schemas/form';
import { createPasswordReset } from '$lib/server/accounts';
import { db } from '$lib/server/db';
import { sendMail } from '$lib/server/mail';
import { passwordResetMessage } from '$lib/server/messages';
import { linkTo } from '$lib/server/origin';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async (event) => {
		const form = await event.request.formData();
		const parsed = parseForm(resetRequest, form);
		if (!parsed.ok) return fail(400, { email: String(form.get('email') ?? ''), errors: parsed.errors });
		const reset = await createPasswordReset(db(), parsed.data.email);
		if (reset) await sendMail(passwordResetMessage(reset.user.email, linkTo(`/reset/${reset.token}`)));
		// The same answer whether or not the address has an account.
		return { sent: true, email: parsed.data.email };
	}
};
