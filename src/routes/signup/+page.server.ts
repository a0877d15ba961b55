import { fail, redirect } from '@sveltejs/kit';
import { signUp, redirectTo as redirectSchema } from '$lib/schemas/account';
import { parseForm } from '$lib/schemas/form';
import { signedInUser } from '$lib/server/access';
import { createAccount } from '$lib/server/accounts';
import { db } from '$lib/server/db';
import { sendMail } from '$lib/server/mail';
import { queueMail } from '$lib/server/mail-queue';
import { mailRefusal, reserveMail } from '$lib/server/mail-throttle';
import { accountExistsMessage } from '$lib/server/messages';
import { passwordSignIn } from '$lib/server/sign-in';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const redirectTo = redirectSchema.parse(event.url.searchParams.get('redirectTo') ?? undefined);
	if (await signedInUser(event)) redirect(303, redirectTo);
	return { redirectTo, email: event.url.searchParams.get('email') ?? '' };
};

export const actions: Actions = {
	default: async (event) => {
		const form = await event.request.formData();
		const parsed = parseForm(signUp, form);
		const echo = { name: String(form.get('name') ?? ''), email: String(form.get('email') ?? '') };
		if (!parsed.ok) return fail(400, { ...echo, errors: parsed.errors });
		// Counted for every sign-up, new address or not: a sign-up may send an e-mail, and a refusal must not say which.
		const allowed = await reserveMail(db(), 'sign-up', { address: parsed.data.email, client: event.getClientAddress() });
		if (!allowed.ok) return fail(429, { ...echo, message: mailRefusal(allowed) });

		const created = await createAccount(db(), parsed.data);
		if (!created.ok) {
			// Say nothing here about whether the address has an account; its owner hears by e-mail.
			const message = accountExistsMessage(parsed.data.email, `${event.url.origin}/signin`);
			queueMail(() => sendMail(message));
			return { checkEmail: true };
		}
		await passwordSignIn(event, parsed.data.email, parsed.data.password);
		redirect(303, parsed.data.redirectTo === '/' ? '/builds' : parsed.data.redirectTo);
	}
};
