import { decode } from '@auth/core/jwt';
import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { and, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import { config } from './config';
import { db } from './db';
import { build, member, user, userSession, wheelDesign, wheelPhoto, workshop, type Role } from './db/schema';
import { sessionIdOf, sessionLifetimeS } from './sessions';
import { workshopsOf, type WorkshopMembership } from './workshops';

// Who may do what, in one place. Every load, form action and API route that touches a workshop's
// data starts here; what it gets back (the workshop id) is what scopes its queries.

export type Action = 'read' | 'edit' | 'manage';

/** Viewers read; editors change builds; owners also manage members. */
export const leastRole: Record<Action, Role> = { read: 'viewer', edit: 'editor', manage: 'owner' };
const rank: Record<Role, number> = { viewer: 1, editor: 2, owner: 3 };

export function allows(role: Role, action: Action): boolean {
	return rank[role] >= rank[leastRole[action]];
}

export const workshopCookie = 'pw-workshop';

export interface SessionUser {
	id: string;
	email: string;
	name: string | null;
}

export interface WorkshopAccess {
	user: SessionUser;
	workshop: WorkshopMembership;
	workshops: WorkshopMembership[];
	can: Record<Action, boolean>;
}

const perRequest = new WeakMap<Request, Promise<SessionUser | null>>();

// A request needs only the two ids the session cookie carries. Auth.js's locals.auth() builds its
// whole configuration, decrypts the JWT and encrypts a renewed one (a key derivation each) on every
// call: a quarter of a signed-in request's CPU in a profile of `npm run bench`. The cookie is read
// here instead, with Auth.js's own decoder, and a token once decrypted is remembered until it
// expires. Nothing is lost by that: the session row is read on every request all the same (signing
// out ends it at once), and the cookie lives as long as the session may (auth.ts `maxAge`), so the
// renewal had nothing to extend.
const sessionCookie = (event: RequestEvent) => `${event.url.protocol === 'https:' ? '__Secure-' : ''}authjs.session-token`;
const decoded = new Map<string, { userId: string; sid: string; expiresMs: number }>();
const decodedLimit = 10_000;

/** The ids the session cookie carries (its JWT decrypted without the database), or null. */
async function tokenOf(event: RequestEvent): Promise<{ userId: string; sid: string } | null> {
	const name = sessionCookie(event);
	const token = event.cookies.get(name);
	if (!token) return null;
	const known = decoded.get(token);
	if (known && known.expiresMs > Date.now()) return { userId: known.userId, sid: known.sid };
	const payload = await decode({ token, secret: config().authSecret, salt: name }).catch(() => null);
	const userId = typeof payload?.sub === 'string' ? payload.sub : undefined;
	const sid = sessionIdOf(payload?.sid);
	if (!userId || !sid || typeof payload?.exp !== 'number') return null;
	if (decoded.size >= decodedLimit) decoded.clear();
	decoded.set(token, { userId, sid, expiresMs: payload.exp * 1000 });
	return { userId, sid };
}

// The session must still have its row and be younger than its lifetime; PostgreSQL's clock decides.
const liveSession = and(
	eq(userSession.id, sql.placeholder('sid')),
	eq(userSession.userId, user.id),
	sql`${userSession.createdAt} > now() - make_interval(secs => ${sql.raw(String(sessionLifetimeS))})`
);

// Prepared statements (named, so each pooled connection parses and plans them once): every
// signed-in request runs one of these. Built on first use, as db() needs the configuration.
let prepared: ReturnType<typeof prepare> | undefined;
const statements = () => (prepared ??= prepare());

function prepare() {
	const userColumns = { id: user.id, email: user.email, name: user.name };
	const sessionUser = db()
		.select(userColumns)
		.from(user)
		.innerJoin(userSession, liveSession)
		.where(eq(user.id, sql.placeholder('userId')))
		.prepare('pw_session_user');
	const mine = and(eq(member.workshopId, build.workshopId), eq(member.userId, user.id));
	const ownerColumns = { ...userColumns, workshopId: build.workshopId, buildId: build.id, role: member.role, workshopName: workshop.name };
	const objectId = sql.placeholder('objectId');
	// The session, its user and the object with the user's membership of its workshop, in one round
	// trip. Left joins: a live session with an object that is missing or not the user's still answers
	// the user (role null), so "signed out" and "not yours" stay apart.
	const base = () => db().select(ownerColumns).from(user).innerJoin(userSession, liveSession);
	const withMember = {
		build: base()
			.leftJoin(build, eq(build.id, objectId))
			.leftJoin(member, mine)
			.leftJoin(workshop, eq(workshop.id, member.workshopId))
			.where(eq(user.id, sql.placeholder('userId')))
			.prepare('pw_object_build'),
		design: base()
			.leftJoin(wheelDesign, eq(wheelDesign.id, objectId))
			.leftJoin(build, eq(build.id, wheelDesign.buildId))
			.leftJoin(member, mine)
			.leftJoin(workshop, eq(workshop.id, member.workshopId))
			.where(eq(user.id, sql.placeholder('userId')))
			.prepare('pw_object_design'),
		photo: base()
			.leftJoin(wheelPhoto, eq(wheelPhoto.id, objectId))
			.leftJoin(build, eq(build.id, wheelPhoto.buildId))
			.leftJoin(member, mine)
			.leftJoin(workshop, eq(workshop.id, member.workshopId))
			.where(eq(user.id, sql.placeholder('userId')))
			.prepare('pw_object_photo')
	};
	return { sessionUser, withMember };
}

/**
 * The signed-in user, or null. The session cookie may outlive the account and its session (signed
 * out, password changed), so both are looked up: one query, with the user's row.
 */
export function signedInUser(event: RequestEvent): Promise<SessionUser | null> {
	let found = perRequest.get(event.request);
	if (!found) {
		found = (async () => {
			const token = await tokenOf(event);
			if (!token) return null;
			const [row] = await statements().sessionUser.execute(token);
			return row ?? null;
		})();
		perRequest.set(event.request, found);
	}
	return found;
}

const isApi = (event: RequestEvent) => event.url.pathname.startsWith('/api/');

/** Pages send a signed-out visitor to sign in and back; API routes answer 401. */
export async function requireUser(event: RequestEvent): Promise<SessionUser> {
	const found = await signedInUser(event);
	if (found) return found;
	if (isApi(event)) error(401, { message: 'Sign in first: this needs an account.', code: 'unauthenticated' });
	redirect(303, `/signin?redirectTo=${encodeURIComponent(event.url.pathname + event.url.search)}`);
}

/**
 * The workshop the request works in, checked for `action`: the one named (API ?workshop=), else
 * the one chosen in the switcher (cookie), else the user's first. A workshop the user is not in
 * answers 404 (as if it did not exist); one where the role is too low answers 403.
 */
export async function workshopAccess(event: RequestEvent, action: Action, workshopId?: string): Promise<WorkshopAccess> {
	const me = await requireUser(event);
	const workshops = await workshopsFor(event, me.id);
	const chosen = event.cookies.get(workshopCookie);
	const current = workshopId ? workshops.find((w) => w.id === workshopId) : (workshops.find((w) => w.id === chosen) ?? workshops[0]);
	if (!current) error(404, { message: 'No such workshop among yours.', code: 'not-found' });
	if (!allows(current.role, action)) forbidden(current, action);
	return { user: me, workshop: current, workshops, can: canOf(current.role) };
}

function forbidden(current: WorkshopMembership, action: Action): never {
	error(403, { message: `Your role in ${current.name} is ${current.role}; this needs ${leastRole[action]} or above.`, code: 'forbidden' });
}

const canOf = (role: Role): Record<Action, boolean> => ({
	read: allows(role, 'read'),
	edit: allows(role, 'edit'),
	manage: allows(role, 'manage')
});

const workshopsPerRequest = new WeakMap<Request, Promise<WorkshopMembership[]>>();

/** The user's workshops, read once per request however many loads ask (the layout and the page). */
export function workshopsFor(event: RequestEvent, userId: string): Promise<WorkshopMembership[]> {
	let found = workshopsPerRequest.get(event.request);
	if (!found) {
		found = workshopsOf(db(), userId);
		workshopsPerRequest.set(event.request, found);
	}
	return found;
}

/** Makes `workshopId` the one the user works in, if they belong to it. */
export async function chooseWorkshop(event: RequestEvent, workshopId: string) {
	const access = await workshopAccess(event, 'read', workshopId);
	event.cookies.set(workshopCookie, access.workshop.id, {
		path: '/',
		httpOnly: true,
		sameSite: 'lax',
		secure: event.url.protocol === 'https:',
		maxAge: 365 * 24 * 60 * 60
	});
	return access;
}

export type ObjectKind = 'build' | 'design' | 'photo';

const notFound = (kind: ObjectKind) => error(404, { message: `No such ${kind} in your workshops.`, code: 'not-found' });

export type ObjectAccess = Omit<WorkshopAccess, 'workshops'> & { buildId: string };

type OwnerRow = Awaited<ReturnType<ReturnType<typeof prepare>['withMember']['build']['execute']>>[number];

async function ownerRow(event: RequestEvent, kind: ObjectKind, id: string): Promise<OwnerRow | undefined> {
	const token = await tokenOf(event);
	if (!token) return undefined;
	const [row] = await statements().withMember[kind].execute({ ...token, objectId: id });
	return row;
}

/**
 * Access to one build, design or photo named by id (from a path): 401 signed out, 404 when it is
 * not in one of the caller's workshops (a malformed or guessed id looks the same as a missing one),
 * 403 when the role is too low. Queries that follow scope by the returned build id.
 *
 * One round trip when nothing of the request has read the session yet (an API call): the session,
 * the user, the object and the membership together. Otherwise (a page, whose layout read the user)
 * one for the object with the membership.
 */
export async function objectAccess(event: RequestEvent, action: Action, kind: ObjectKind, id: string): Promise<ObjectAccess> {
	const validId = z.uuid().safeParse(id).success;
	let owner: Promise<OwnerRow | undefined> | undefined;
	if (validId && !perRequest.has(event.request)) {
		const together = (async () => {
			const token = await tokenOf(event);
			if (!token) return { me: null, row: undefined };
			const [row] = await statements().withMember[kind].execute({ ...token, objectId: id });
			return { me: row ? { id: row.id, email: row.email, name: row.name } : null, row };
		})();
		const me = together.then((t) => t.me);
		// Whoever reads the user next shares this; a failure is thrown where it is awaited below.
		me.catch(() => undefined);
		perRequest.set(event.request, me);
		owner = together.then((t) => t.row);
		// When the user's read throws first (the database went away), nothing awaits this one: an
		// unhandled rejection would end the process (seen when faults.test.ts stopped PostgreSQL).
		owner.catch(() => undefined);
	}
	const me = await requireUser(event);
	if (!validId) notFound(kind);
	const row = owner ? await owner : await ownerRow(event, kind, id);
	if (!row?.role || !row.workshopId || !row.buildId || row.workshopName === null) notFound(kind);
	const current: WorkshopMembership = { id: row!.workshopId!, name: row!.workshopName!, role: row!.role! };
	if (!allows(current.role, action)) forbidden(current, action);
	return { user: me, workshop: current, can: canOf(current.role), buildId: row!.buildId! };
}
