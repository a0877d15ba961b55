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
import { linkThrottledTarget } from '$lib/server/mail-throttle';
import { signInLinkMessage } from '$lib/server/messages';

/** Too many failed attempts: the sign-in page says so and when to try again. */
class Throttled extends CredentialsSignin {
	code = 'throttled';
}

export const signInLinkLifetimeS = 30 * 60;

// Sessions are JWTs in an httpOnly cookie: Auth.js's Credentials provider works only with JWT
// sessions, even with a database adapter. The adapter still keeps users and sign-in link tokens.
export const { handle: authHandle, signIn, signOut } = SvelteKitAuth(async (event) => {
	const c = config();
	return {
		adapter: DrizzleAdapter(db(), { usersTable: user, accountsTable: account, verificationTokensTable: verificationToken }),
		session: { strategy: 'jwt', maxAge: 30 * 24 * 60 * 60 },
		secret: c.authSecret,
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
					await sendMail(signInLinkMessage(identifier, url));
				}
			})
		],
		events: {
			// A first sign-in by e-mail link creates the user through the adapter; give them a workshop too.
			async createUser({ user: created }) {
				if (created.id && created.email) await createPersonalWorkshop(db(), { id: created.id, email: created.email, name: created.name ?? null });
			}
		},
		callbacks: {
			// Every sign-in link, asked through our form or Auth.js's own route, is counted before it is
			// made; past the limit Auth.js sends nothing and goes to the address returned (mail-throttle.ts).
			async signIn({ user: who, email }) {
				if (!email?.verificationRequest || !who.email) return true;
				return (await linkThrottledTarget(db(), who.email, event.getClientAddress())) ?? true;
			},
			session({ session, token }) {
				if (token.sub) session.user.id = token.sub;
				return session;
			}
		}
	};
});
