import { CredentialsSignin, SvelteKitAuth } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { DrizzleAdapter } from '@auth/drizzle-adapter';
import { signIn as signInForm } from '$lib/schemas/account';
import { checkPassword, createPersonalWorkshop } from '$lib/server/accounts';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { account, user, verificationToken } from '$lib/server/db/schema';
import { sendMail } from '$lib/server/mail';
import { confirmAddressMessage, signInLinkMessage } from '$lib/server/messages';
import { linkThrottledTarget } from '$lib/server/mail-throttle';
import { confirmAddress, isUnconfirmed, proofCookie } from '$lib/server/address-proof';
import { linkTo, onOrigin } from '$lib/server/origin';
import { redirectTarget } from '$lib/server/redirect-target';
import { endSession, sessionIdOf, sessionLifetimeS, startSession } from '$lib/server/sessions';

/** Too many failed attempts: the sign-in page says so and when to try again. */
class Throttled extends CredentialsSignin {
	code = 'throttled';
}

export const signInLinkLifetimeS = 30 * 60;

// Sessions are JWTs in an httpOnly cookie: Auth.js's Credentials provider works only with JWT
// sessions, even with a database adapter. The adapter still keeps users and sign-in link tokens.
// Each JWT names a user_session row (sessions.ts): without its row, the cookie signs in no one.
export const {
	handle: authHandle,
	signIn,
	signOut
} = SvelteKitAuth(async (event) => {
	const c = config();
	return {
		adapter: DrizzleAdapter(db(), { usersTable: user, accountsTable: account, verificationTokensTable: verificationToken }),
		session: { strategy: 'jwt', maxAge: sessionLifetimeS },
		secret: c.authSecret,
		// Auth.js builds its links from the request's Host: the built server refuses any Host but
		// ORIGIN's (origin.ts hostHandle), sign-in.ts hands Auth.js ORIGIN's host, and the e-mailed
		// link is moved onto ORIGIN below in any case.
		trustHost: true,
		logger: {
			// A refused password or a spent sign-in link is an answer, not a fault: keep them out of the error log.
			error(err) {
				if (err instanceof CredentialsSignin || (err as { type?: string }).type === 'Verification') return;
				console.error('[auth]', err);
			}
		},
		pages: { signIn: '/signin', error: '/signin', verifyRequest: '/signin/check-email' },
		providers: [
			Credentials({
				credentials: { email: {}, password: {} },
				async authorize(raw) {
					const parsed = signInForm.safeParse(raw);
					if (!parsed.success) return null;
					const result = await checkPassword(db(), parsed.data.email, parsed.data.password, event.getClientAddress());
					if (result.ok) return result.user;
					if (result.reason === 'throttled') throw new Throttled();
					return null;
				}
			}),
			Nodemailer({
				server: c.smtpUrl,
				from: c.mailFrom,
				maxAge: signInLinkLifetimeS,
				async sendVerificationRequest({ identifier, url }) {
					const link = new URL(onOrigin(url));
					const back = link.searchParams.get('callbackUrl');
					const backUrl = back && URL.canParse(back) ? new URL(back) : null;
					link.searchParams.set(
						'callbackUrl',
						linkTo(redirectTarget(backUrl && backUrl.origin === c.origin ? backUrl.pathname + backUrl.search : null))
					);
					// An account made by sign-up and never confirmed gets the same link, said as what it also does.
					const unconfirmed = await isUnconfirmed(db(), identifier);
					await sendMail((unconfirmed ? confirmAddressMessage : signInLinkMessage)(identifier, link.href));
				}
			})
		],
		events: {
			// A first sign-in by e-mail link creates the user through the adapter; give them a workshop too.
			async createUser({ user: created }) {
				if (created.id && created.email)
					await createPersonalWorkshop(db(), { id: created.id, email: created.email, name: created.name ?? null });
			},
			async signOut(message) {
				const sid = 'token' in message ? sessionIdOf(message.token?.sid) : null;
				if (sid) await endSession(db(), sid);
			}
		},
		callbacks: {
			// Every sign-in link, asked through our form or Auth.js's own route, is counted before it is
			// made; past the limit Auth.js sends nothing and goes to the address returned (mail-throttle.ts).
			async signIn({ user: who, email }) {
				if (!email?.verificationRequest || !who.email) return true;
				return (await linkThrottledTarget(db(), who.email, event.getClientAddress())) ?? true;
			},
			async jwt({ token, user: signedIn, account: via }) {
				if (signedIn?.id) {
					// Opening a mailed link proves the address (and may clear a password nobody verified).
					if (via?.type === 'email') await confirmAddress(db(), signedIn.id, event.cookies.get(proofCookie));
					token.sid = await startSession(db(), signedIn.id);
				}
				return token;
			},
			session({ session, token }) {
				if (token.sub) session.user.id = token.sub;
				Object.assign(session, { sid: sessionIdOf(token.sid) });
				return session;
			},
			redirect({ url }) {
				const parsed = URL.canParse(url, c.origin) ? new URL(url, c.origin) : null;
				return linkTo(redirectTarget(parsed && parsed.origin === c.origin ? parsed.pathname + parsed.search + parsed.hash : null));
			}
		}
	};
});
