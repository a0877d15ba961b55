import { integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, unique, uuid, index, check } from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
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
	/**
	 * When someone who holds the address stood behind the password (a reset link, a change by a
	 * confirmed account, the sign-up browser opening its confirmation link). Null: a password nobody
	 * verified, which confirming the address by link clears (address-proof.ts).
	 */
	passwordConfirmedAt: timestamp('password_confirmed_at', { withTimezone: true }),
	createdAt: createdAt()
});

/**
 * One row per signed-in browser. The session cookie (a JWT) names its row; a request whose row is
 * gone is signed out, so sign-out, a password change or reset and "sign out everywhere" end
 * sessions at once, however long the cookie would still be valid (sessions.ts).
 */
export const userSession = pgTable(
	'user_session',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: uuid('user_id')
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		createdAt: createdAt()
	},
	(t) => [index('user_session_user').on(t.userId)]
);

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

/**
 * Counts per key in a fixed window (throttle.ts): failed sign-ins per e-mail or client address, for
 * slowing down guessing, and e-mails asked for per address, client and workshop (mail-throttle.ts).
 */
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
		/** The engine profile and the measured sensor set-up: the phasing check's flat params (src/lib/schemas/phasing.ts). */
		engineProfile: jsonb('engine_profile').$type<FlatParams>(),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	// One index per sort the list offers, ending in the id that breaks ties, so a keyset page is an
	// index range scan in either direction (builds.ts); the unique (workshop, name) serves the name
	// sort. Search matches name and engine anywhere in them: trigram indexes serve `ilike '%q%'`.
	(t) => [
		unique('build_workshop_name').on(t.workshopId, t.name),
		index('build_workshop_updated').on(t.workshopId, t.updatedAt.desc().nullsFirst(), t.id.desc().nullsFirst()),
		index('build_workshop_created').on(t.workshopId, t.createdAt.desc().nullsFirst(), t.id.desc().nullsFirst()),
		index('build_name_trgm').using('gin', t.name.op('gin_trgm_ops')),
		index('build_engine_trgm').using('gin', t.engine.op('gin_trgm_ops'))
	]
);

/** Flat string parameters as the tools and the API take them (a wheel's, a tape's, the phasing check's). */
export type FlatParams = Record<string, string>;

// The build page's lists (designs, records, tapes, photos, packages, checks, activity) are read newest
// first a page at a time: each has an index on (build, time desc, id desc), which also serves the
// foreign key's cascade from build.
const buildRef = () =>
	uuid('build_id')
		.notNull()
		.references(() => build.id, { onDelete: 'cascade' });
const authorRef = (name = 'author_id') => uuid(name).references(() => user.id, { onDelete: 'set null' });

/** A trigger wheel of a build; its states are its revisions. */
export const wheelDesign = pgTable(
	'wheel_design',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		buildId: buildRef(),
		name: text('name').notNull(),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [
		unique('wheel_design_build_name').on(t.buildId, t.name),
		index('wheel_design_build_updated').on(t.buildId, t.updatedAt.desc().nullsFirst(), t.id.desc().nullsFirst())
	]
);

/**
 * One saved state of a wheel design, never changed after it is written. The unique (design,
 * number) pair is what keeps two concurrent saves from the same base from both landing.
 */
export const wheelRevision = pgTable(
	'wheel_revision',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		designId: uuid('design_id')
			.notNull()
			.references(() => wheelDesign.id, { onDelete: 'cascade' }),
		number: integer('number').notNull(),
		params: jsonb('params').$type<FlatParams>().notNull(),
		message: text('message').notNull().default(''),
		/** Set when the revision restores an older one. */
		restoredFrom: integer('restored_from'),
		authorId: authorRef(),
		createdAt: createdAt()
	},
	(t) => [unique('wheel_revision_design_number').on(t.designId, t.number), check('wheel_revision_number_positive', sql`${t.number} >= 1`)]
);

/** Two piston-stop marks and the TDC found from them. */
export const tdcRecord = pgTable(
	'tdc_record',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		buildId: buildRef(),
		label: text('label').notNull().default(''),
		params: jsonb('params').$type<FlatParams>().notNull(),
		tdcDeg: text('tdc_deg').notNull(),
		authorId: authorRef(),
		createdAt: createdAt()
	},
	(t) => [index('tdc_record_build_time').on(t.buildId, t.createdAt.desc().nullsFirst(), t.id.desc().nullsFirst())]
);

/** A degree tape printed for the build's timing hub. */
export const degreeTape = pgTable(
	'degree_tape',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		buildId: buildRef(),
		label: text('label').notNull().default(''),
		params: jsonb('params').$type<FlatParams>().notNull(),
		authorId: authorRef(),
		createdAt: createdAt()
	},
	(t) => [index('degree_tape_build_time').on(t.buildId, t.createdAt.desc().nullsFirst(), t.id.desc().nullsFirst())]
);

/** One speed case of a saved signal check as it was answered: the headline the build page and sheet print. */
export interface SignalCaseHeadline {
	name: string;
	rpm: number;
	/** The sync margin in percent (negative: the gap is missed or an ordinary space taken for it). */
	marginPct: number;
	verdict: 'safe' | 'tight' | 'fails';
}

/** A signal check kept in a build: its parameters as the signal check takes them, and each case's sync margin then. */
export const signalCheck = pgTable(
	'signal_check',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		buildId: buildRef(),
		label: text('label').notNull().default(''),
		params: jsonb('params').$type<FlatParams>().notNull(),
		cases: jsonb('cases').$type<SignalCaseHeadline[]>().notNull(),
		authorId: authorRef(),
		createdAt: createdAt()
	},
	(t) => [index('signal_check_build_time').on(t.buildId, t.createdAt.desc().nullsFirst(), t.id.desc().nullsFirst())]
);

/** An uploaded photo of a real wheel: the bytes live in the object store under `storageKey`. */
export const wheelPhoto = pgTable(
	'wheel_photo',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		buildId: buildRef(),
		name: text('name').notNull(),
		mime: text('mime').notNull(),
		width: integer('width').notNull(),
		height: integer('height').notNull(),
		sizeBytes: integer('size_bytes').notNull(),
		sha256: text('sha256').notNull(),
		storageKey: text('storage_key').notNull().unique(),
		thumbnailKey: text('thumbnail_key').notNull().unique(),
		/** The last photo reading: the taps given and what was read. */
		photoReading: jsonb('photo_reading').$type<Record<string, unknown>>(),
		uploadedBy: authorRef('uploaded_by'),
		createdAt: createdAt()
	},
	(t) => [index('wheel_photo_build_time').on(t.buildId, t.createdAt.desc().nullsFirst(), t.id.desc().nullsFirst())]
);

/** What was sent to a fabricator: the DXF and the spec sheet of one revision. */
export const cuttingPackage = pgTable(
	'cutting_package',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		buildId: buildRef(),
		designId: uuid('design_id').references(() => wheelDesign.id, { onDelete: 'set null' }),
		revision: integer('revision').notNull(),
		sentTo: text('sent_to').notNull(),
		details: jsonb('details').$type<FlatParams>().notNull(),
		messageId: text('message_id'),
		sentBy: authorRef('sent_by'),
		createdAt: createdAt()
	},
	(t) => [index('cutting_package_build_time').on(t.buildId, t.createdAt.desc().nullsFirst(), t.id.desc().nullsFirst())]
);

/** The build's activity log, newest first when read. */
export const activity = pgTable(
	'activity',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		buildId: buildRef(),
		actorId: authorRef('actor_id'),
		kind: text('kind').notNull(),
		summary: text('summary').notNull(),
		createdAt: createdAt()
	},
	(t) => [index('activity_build_newest').on(t.buildId, t.createdAt.desc().nullsFirst(), t.id.desc().nullsFirst())]
);

export type Role = (typeof role.enumValues)[number];
