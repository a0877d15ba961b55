import { fail, redirect } from '@sveltejs/kit';
import { signUp } from '$lib/schemas/account';
import { parseForm } from '$lib/schemas/form';
import { signedInUser } from '$lib/server/access';
import { rememberSignUp } from '$lib/server/address-proof';
import { createAccount } from '$lib/server/accounts';
import { db } from '$lib/server/db';
import { sendMail } from '$lib/server/mail';
import { queueMail } from '$lib/server/mail-queue';
import { mailRefusal, reserveMail } from '$lib/server/mail-throttle';
import { accountExistsMessage } from '$lib/server/messages';
import { linkTo } from '$lib/server/origin';
import { redirectTarget } from '$lib/server/redirect-target';
import { passwordSignIn, sendSignInLink } from '$lib/server/sign-in';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const redirectTo = redirectTarget(event.url.searchParams.get('redirectTo'));
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
			const message = accountExistsMessage(parsed.data.email, linkTo('/signin'));
			queueMail(() => sendMail(message));
			return { checkEmail: true };
		}
		const next = redirectTarget(parsed.data.redirectTo);
		await passwordSignIn(event, parsed.data.email, parsed.data.password);
		// The account is unconfirmed until a link mailed to the address is opened (address-proof.ts);
		// this browser is marked as the one that chose the password, so opening the link here keeps it.
		await rememberSignUp(db(), event.cookies, created.user.id, event.url.protocol === 'https:');
		await sendSignInLink(event, parsed.data.email, next);
		redirect(303, next);
	}
};
