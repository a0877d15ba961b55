import { z } from 'zod';
import { singleLine } from './text';

export const passwordLimits = { min: 10, max: 200 } as const;

export const email = z
	.string({ error: 'email: required' })
	.trim()
	.toLowerCase()
	.max(254, { error: 'email: at most 254 characters' })
	.pipe(z.email({ error: 'email: an address like name@example.com' }));

export const password = z
	.string({ error: 'password: required' })
	.min(passwordLimits.min, { error: `password: ${passwordLimits.min} to ${passwordLimits.max} characters` })
	.max(passwordLimits.max, { error: `password: ${passwordLimits.min} to ${passwordLimits.max} characters` });

/** Where to go afterwards, as sent: the server keeps it only when it is a path of this app (redirect-target.ts). */
export const redirectTo = z.string().optional();

export const signUp = z.object({
	// One line: the name is quoted in invitation e-mails and names the personal workshop.
	name: singleLine('name', 80, 1),
	email,
	password,
	redirectTo
});

export const signIn = z.object({
	email,
	// Any length is accepted here: a sign-in must not say which rule a stored password follows.
	password: z
		.string({ error: 'password: required' })
		.min(1, { error: 'password: required' })
		.max(1000, { error: 'password: at most 1000 characters' }),
	redirectTo
});

export const signInLink = z.object({ email, redirectTo });

export const resetRequest = z.object({ email });

export const resetPassword = z
	.object({ password, confirm: z.string() })
	.refine((v) => v.password === v.confirm, { error: 'confirm: must match the new password', path: ['confirm'] });

export const changePassword = z
	.object({
		current: z
			.string({ error: 'current: required' })
			.min(1, { error: 'current: required' })
			.max(1000, { error: 'current: at most 1000 characters' }),
		password,
		confirm: z.string()
	})
	.refine((v) => v.password === v.confirm, { error: 'confirm: must match the new password', path: ['confirm'] });
