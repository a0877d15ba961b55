import { isRedirect, type RequestEvent } from '@sveltejs/kit';
import { CredentialsSignin } from '@auth/sveltekit';
import { signIn, signOut } from '../../auth';
import { originHeaders } from './origin';
import { throttledFrom } from './mail-throttle';

/**
 * Runs one of Auth.js's SvelteKit actions with the fields we give it (our own forms parse and
 * check their input first), and returns where Auth.js wanted to send the browser. Auth.js sets
 * its cookies on the event; it answers by redirecting, with ?error=… in the target on failure.
 */
async function runAuthAction(action: typeof signIn, event: RequestEvent, fields: Record<string, string>): Promise<URL> {
	// Auth.js makes its links (the e-mailed one too) from these headers: give it ORIGIN's host only.
	const headers = originHeaders(event.request.headers);
	headers.set('content-type', 'application/x-www-form-urlencoded');
	const request = new Request(event.url, { method: 'POST', headers, body: new URLSearchParams(fields) });
	try {
		await action({ ...event, request });
	} catch (thrown) {
		if (isRedirect(thrown)) return new URL(thrown.location, event.url);
		throw thrown;
	}
	throw new Error('Auth.js answered without a redirect');
}

export type SignInOutcome = { ok: true } | { ok: false; reason: 'invalid' | 'throttled' };

/** Signs in with e-mail and password without leaving the page, so the form can show its own message. */
export async function passwordSignIn(event: RequestEvent, email: string, password: string): Promise<SignInOutcome> {
	try {
		const target = await runAuthAction(signIn, event, { providerId: 'credentials', email, password, redirectTo: '/' });
		if (!target.searchParams.has('error')) return { ok: true };
		return { ok: false, reason: target.searchParams.get('code') === 'throttled' ? 'throttled' : 'invalid' };
	} catch (thrown) {
		// Called from the server, Auth.js throws a refused sign-in instead of redirecting.
		if (thrown instanceof CredentialsSignin) return { ok: false, reason: thrown.code === 'throttled' ? 'throttled' : 'invalid' };
		throw thrown;
	}
}

/** Sends a sign-in link by e-mail (Auth.js makes and stores the token), unless the e-mail throttle refuses it. */
export async function sendSignInLink(
	event: RequestEvent,
	email: string,
	redirectTo: string
): Promise<{ ok: true } | { ok: false; message: string }> {
	const target = await runAuthAction(signIn, event, { providerId: 'nodemailer', email, redirectTo });
	const refused = throttledFrom(target);
	return refused ? { ok: false, message: refused } : { ok: true };
}

/** Signs this browser out; its session row goes with it (auth.ts, events.signOut). */
export async function endSession(event: RequestEvent): Promise<void> {
	await runAuthAction(signOut, event, { redirectTo: '/' });
}

export const signInMessages = {
	invalid: 'That e-mail and password do not match an account. Check both, or ask for a sign-in link instead.',
	throttled: 'Too many failed sign-ins. Wait 15 minutes, or reset the password by e-mail.',
	Verification: 'That sign-in link has expired or was used already. Ask for a new one.',
	default: 'Sign-in did not work. Try again, or ask for a sign-in link.'
} as const;
