import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { and, eq, gt } from 'drizzle-orm';
import { z } from 'zod';
import { db } from './db';
import { build, member, user, userSession, wheelDesign, wheelPhoto, type Role } from './db/schema';
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

/**
 * The signed-in user, or null. The session cookie may outlive the account and its session (signed
 * out, password changed), so both are looked up: one query, with the user's row.
 */
export function signedInUser(event: RequestEvent): Promise<SessionUser | null> {
	let found = perRequest.get(event.request);
	if (!found) {
		found = (async () => {
			const session = await event.locals.auth();
			const id = session?.user?.id;
			const sid = sessionIdOf((session as { sid?: unknown } | null)?.sid);
			if (!id || !sid) return null;
			const live = and(
				eq(userSession.id, sid),
				eq(userSession.userId, user.id),
				gt(userSession.createdAt, new Date(Date.now() - sessionLifetimeS * 1000))
			);
			const [row] = await db()
				.select({ id: user.id, email: user.email, name: user.name })
				.from(user)
				.innerJoin(userSession, live)
				.where(eq(user.id, id));
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
	const workshops = await workshopsOf(db(), me.id);
	const chosen = event.cookies.get(workshopCookie);
	const current = workshopId ? workshops.find((w) => w.id === workshopId) : (workshops.find((w) => w.id === chosen) ?? workshops[0]);
	if (!current) error(404, { message: 'No such workshop among yours.', code: 'not-found' });
	if (!allows(current.role, action)) {
		error(403, {
			message: `Your role in ${current.name} is ${current.role}; this needs ${leastRole[action]} or above.`,
			code: 'forbidden'
		});
	}
	const can = { read: allows(current.role, 'read'), edit: allows(current.role, 'edit'), manage: allows(current.role, 'manage') };
	return { user: me, workshop: current, workshops, can };
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

/** The build (and workshop) an object belongs to, found only among the workshops `userId` is a member of. */
async function ownerOf(kind: ObjectKind, id: string, userId: string): Promise<{ workshopId: string; buildId: string } | undefined> {
	const mine = and(eq(member.workshopId, build.workshopId), eq(member.userId, userId));
	const columns = { workshopId: build.workshopId, buildId: build.id };
	const rows =
		kind === 'build'
			? await db().select(columns).from(build).innerJoin(member, mine).where(eq(build.id, id))
			: kind === 'design'
				? await db()
						.select(columns)
						.from(wheelDesign)
						.innerJoin(build, eq(build.id, wheelDesign.buildId))
						.innerJoin(member, mine)
						.where(eq(wheelDesign.id, id))
				: await db()
						.select(columns)
						.from(wheelPhoto)
						.innerJoin(build, eq(build.id, wheelPhoto.buildId))
						.innerJoin(member, mine)
						.where(eq(wheelPhoto.id, id));
	return rows[0];
}

/**
 * Access to one build, design or photo named by id (from a path): 401 signed out, 404 when it is
 * not in one of the caller's workshops (a malformed or guessed id looks the same as a missing one),
 * 403 when the role is too low. Queries that follow scope by the returned build id.
 */
export async function objectAccess(
	event: RequestEvent,
	action: Action,
	kind: ObjectKind,
	id: string
): Promise<WorkshopAccess & { buildId: string }> {
	const me = await requireUser(event);
	if (!z.uuid().safeParse(id).success) notFound(kind);
	const found = await ownerOf(kind, id, me.id);
	if (!found) notFound(kind);
	const access = await workshopAccess(event, action, found!.workshopId);
	return { ...access, buildId: found!.buildId };
}
