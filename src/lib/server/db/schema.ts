import { integer, pgEnum, pgTable, primaryKey, text, timestamp, unique, uuid, index } from 'drizzle-orm/pg-core';
import type { AdapterAccountType } from '@auth/core/adapters';

const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();
const updatedAt = () =>
	timestamp('updated_at', { withTimezone: true })
		.notNull()
		.defaultNow()
		.$onUpdate(() => new Date());

// ---- People and sign-in. Property names are the ones @auth/drizzle-adapter expects. ----

export const user = pgTable('user', {
	id: uuid('id').primaryKey().defaultRandom(),
	name: text('name'),
	/** Always stored lower-case (Auth.js normalises sign-in link addresses the same way). */
	email: text('email').notNull().unique(),
	emailVerified: timestamp('email_verified', { mode: 'date', withTimezone: true }),
	image: text('image'),
	/** argon2id hash; null for accounts that only ever signed in by e-mail link. */
	passwordHash: text('password_hash'),
	createdAt: createdAt()
});

export const account = pgTable(
	'account',
	{
		userId: uuid('user_id')
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		type: text('type').$type<AdapterAccountType>().notNull(),
		provider: text('provider').notNull(),
		providerAccountId: text('provider_account_id').notNull(),
		refresh_token: text('refresh_token'),
		access_token: text('access_token'),
		expires_at: integer('expires_at'),
		token_type: text('token_type'),
		scope: text('scope'),
		id_token: text('id_token'),
		session_state: text('session_state')
	},
	(t) => [primaryKey({ columns: [t.provider, t.providerAccountId] })]
);

/** Auth.js's sign-in link tokens (stored hashed by Auth.js). */
export const verificationToken = pgTable(
	'verification_token',
	{
		identifier: text('identifier').notNull(),
		token: text('token').notNull(),
		expires: timestamp('expires', { mode: 'date', withTimezone: true }).notNull()
	},
	(t) => [primaryKey({ columns: [t.identifier, t.token] })]
);

/** Password reset links; only the SHA-256 of the token is kept. */
export const passwordReset = pgTable('password_reset', {
	tokenHash: text('token_hash').primaryKey(),
	userId: uuid('user_id')
		.notNull()
		.references(() => user.id, { onDelete: 'cascade' }),
	expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
	createdAt: createdAt()
});

/** Failed sign-ins per key (an e-mail address or a client address), for slowing down guessing. */
export const signInFailure = pgTable('sign_in_failure', {
	key: text('key').primaryKey(),
	failures: integer('failures').notNull().default(0),
	windowStart: timestamp('window_start', { withTimezone: true }).notNull().defaultNow()
});

// ---- Workshops, members, invitations ----

export const role = pgEnum('role', ['owner', 'editor', 'viewer']);

/** The team space: a shop or a single builder's garage. */
export const workshop = pgTable('workshop', {
	id: uuid('id').primaryKey().defaultRandom(),
	slug: text('slug').notNull().unique(),
	name: text('name').notNull(),
	createdAt: createdAt()
});

export const member = pgTable(
	'member',
	{
		workshopId: uuid('workshop_id')
			.notNull()
			.references(() => workshop.id, { onDelete: 'cascade' }),
		userId: uuid('user_id')
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		role: role('role').notNull(),
		createdAt: createdAt()
	},
	(t) => [primaryKey({ columns: [t.workshopId, t.userId] }), index('member_user').on(t.userId)]
);

/** An owner's invitation by e-mail: single use (acceptedAt), expiring; only the token's SHA-256 is kept. */
export const invitation = pgTable(
	'invitation',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		workshopId: uuid('workshop_id')
			.notNull()
			.references(() => workshop.id, { onDelete: 'cascade' }),
		email: text('email').notNull(),
		role: role('role').notNull(),
		tokenHash: text('token_hash').notNull().unique(),
		invitedBy: uuid('invited_by').references(() => user.id, { onDelete: 'set null' }),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		acceptedAt: timestamp('accepted_at', { withTimezone: true }),
		acceptedBy: uuid('accepted_by').references(() => user.id, { onDelete: 'set null' }),
		createdAt: createdAt()
	},
	(t) => [index('invitation_workshop').on(t.workshopId)]
);

// ---- Builds ----

/** One engine project inside a workshop. */
export const build = pgTable(
	'build',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		workshopId: uuid('workshop_id')
			.notNull()
			.references(() => workshop.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		engine: text('engine').notNull().default(''),
		notes: text('notes').notNull().default(''),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [unique('build_workshop_name').on(t.workshopId, t.name)]
);

export type Role = (typeof role.enumValues)[number];
