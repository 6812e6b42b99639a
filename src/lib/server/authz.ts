// The one place that decides who may do what. Every load, action and API route asks here first.
import { error } from '@sveltejs/kit';
import { and, eq, isNull } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { memberships, studios, type StudioRole, type TokenScope } from '$lib/server/db/schema';
import type { SessionUser } from '$lib/server/session';

export const CAPABILITIES = [
	'studio.view',
	'studio.rename',
	'studio.delete',
	'members.view',
	'members.manage',
	'invitations.manage',
	'setups.view',
	'setups.edit',
	'setups.duplicateFrom',
	'gear.view',
	'gear.edit'
] as const;
export type Capability = (typeof CAPABILITIES)[number];

const viewer: Capability[] = ['studio.view', 'members.view', 'setups.view', 'setups.duplicateFrom', 'gear.view'];
const editor: Capability[] = [...viewer, 'setups.edit', 'gear.edit'];

/**
 * What each role may do. Workshop roles (instructor, student) are added as new keys here with
 * workshop capabilities; the membership rows and the checks below do not change shape.
 */
export const ROLE_CAPABILITIES: Record<StudioRole, ReadonlySet<Capability>> = {
	viewer: new Set(viewer),
	editor: new Set(editor),
	owner: new Set(CAPABILITIES)
};

const ROLE_ORDER: readonly StudioRole[] = ['viewer', 'editor', 'owner'];

/** Whether `role` is above `than` (owner above editor above viewer): an invitation may raise a role, never lower it. */
export function outranks(role: StudioRole, than: StudioRole): boolean {
	return ROLE_ORDER.indexOf(role) > ROLE_ORDER.indexOf(than);
}

export interface StudioAccess {
	studioId: string;
	studioName: string;
	isPersonal: boolean;
	/** The caller's own role; null for a site admin who is not a member. */
	role: StudioRole | null;
	isAdmin: boolean;
}

export function can(access: StudioAccess | null, capability: Capability): boolean {
	if (!access) return false;
	if (access.isAdmin) return true;
	return access.role !== null && ROLE_CAPABILITIES[access.role].has(capability);
}

/** The caller's standing in a studio, or null when they may not see it at all. */
export async function studioAccess(user: SessionUser | null, studioId: string): Promise<StudioAccess | null> {
	if (!user || !isUuid(studioId)) return null;
	const [row] = await db
		.select({ id: studios.id, name: studios.name, personalOwnerId: studios.personalOwnerId, role: memberships.role })
		.from(studios)
		.leftJoin(memberships, and(eq(memberships.studioId, studios.id), eq(memberships.userId, user.id)))
		.where(and(eq(studios.id, studioId), isNull(studios.deletedAt)));
	if (!row || (!row.role && !user.isAdmin)) return null;
	return {
		studioId: row.id,
		studioName: row.name,
		isPersonal: row.personalOwnerId !== null,
		role: row.role ?? null,
		isAdmin: user.isAdmin
	};
}

export function requireUser(user: SessionUser | null): SessionUser {
	if (!user) error(401, 'Sign in first.');
	return user;
}

/**
 * Answers 401 when anonymous, 404 when the studio is not visible to the caller (never revealing that it
 * exists), 403 when the caller's role does not allow `capability`.
 */
export async function authorizeStudio(
	user: SessionUser | null,
	studioId: string,
	capability: Capability
): Promise<StudioAccess> {
	const signedIn = requireUser(user);
	const access = await studioAccess(signedIn, studioId);
	if (!access) error(404, 'No such studio.');
	if (!can(access, capability)) error(403, `Your role in this studio does not allow that (${capability}).`);
	return access;
}

export function isUuid(value: string): boolean {
	return /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(value);
}

/**
 * Personal access tokens are for the JSON API only: on a page or a form action a bearer token is never a
 * signed-in user (pages act for a person at a browser, with a session cookie and the origin check).
 */
export function tokenMayReach(pathname: string): boolean {
	return pathname === '/api' || pathname.startsWith('/api/');
}

const READ_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** A read-only token may only read; any other method is a write, whatever the route. */
export function tokenMayUse(scope: TokenScope, method: string): boolean {
	return scope === 'read-write' || READ_METHODS.has(method.toUpperCase());
}
