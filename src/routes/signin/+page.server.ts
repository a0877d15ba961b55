import { fail, redirect } from '@sveltejs/kit';
import { signIn as signInSchema, signInLink } from '$lib/schemas/account';
import { parseForm } from '$lib/schemas/form';
import { signedInUser } from '$lib/server/access';
import { redirectTarget } from '$lib/server/redirect-target';
import { throttledFrom } from '$lib/server/mail-throttle';
import { passwordSignIn, sendSignInLink, signInMessages } from '$lib/server/sign-in';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const redirectTo = redirectTarget(event.url.searchParams.get('redirectTo'));
	if (await signedInUser(event)) redirect(303, redirectTo);
	// Auth.js sends failed sign-in links back here with ?error=…
	const authError = event.url.searchParams.get('error');
	return {
		redirectTo,
		passwordReset: event.url.searchParams.has('reset'),
		message: authError
			? authError === 'Verification'
				? signInMessages.Verification
				: (throttledFrom(event.url) ?? signInMessages.default)
			: null
	};
};

export const actions: Actions = {
	password: async (event) => {
		const form = await event.request.formData();
		const parsed = parseForm(signInSchema, form);
		const email = String(form.get('email') ?? '');
		if (!parsed.ok) return fail(400, { form: 'password', email, errors: parsed.errors });
		const outcome = await passwordSignIn(event, parsed.data.email, parsed.data.password);
		if (!outcome.ok) {
			return fail(outcome.reason === 'throttled' ? 429 : 400, { form: 'password', email, message: signInMessages[outcome.reason] });
		}
		redirect(303, redirectTarget(parsed.data.redirectTo));
	},

	link: async (event) => {
		const form = await event.request.formData();
		const parsed = parseForm(signInLink, form);
		if (!parsed.ok) return fail(400, { form: 'link', email: String(form.get('email') ?? ''), errors: parsed.errors });
		const sent = await sendSignInLink(event, parsed.data.email, redirectTarget(parsed.data.redirectTo));
		if (!sent.ok) return fail(429, { form: 'link', email: parsed.data.email, message: sent.message });
		redirect(303, '/signin/check-email');
	}
};
