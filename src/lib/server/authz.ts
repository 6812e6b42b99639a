// The one place that decides who may do what. Every load, action and API route asks here first.
import { error, isHttpError, redirect } from '@sveltejs/kit';
import { and, eq, isNull } from 'drizzle-orm';
import { db } from '$lib/server/db';
import {
	memberships,
	setups,
	studios,
	workshopMembers,
	workshops,
	type Setup,
	type StudioRole,
	type TokenScope,
	type Workshop,
	type WorkshopRole
} from '$lib/server/db/schema';
import { findGearRow } from '$lib/server/db/queries/gear';
import type { StudioFilter } from '$lib/server/db/queries/visibility';
import { findShotRow } from '$lib/server/db/queries/shots';
import { findExerciseRow, findHandInRow } from '$lib/server/db/queries/exercises';
import type { SessionUser } from '$lib/server/session';
import { isUuid } from '$lib/uuid';

export { isUuid };

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
	'gear.edit',
	'shots.view',
	'shots.edit'
] as const;
export type Capability = (typeof CAPABILITIES)[number];

const viewer: Capability[] = ['studio.view', 'members.view', 'setups.view', 'setups.duplicateFrom', 'gear.view', 'shots.view'];
// Shots: viewers see shots and measures; editors upload, measure, calibrate and delete.
const editor: Capability[] = [...viewer, 'setups.edit', 'gear.edit', 'shots.edit'];

/**
 * What each studio role may do. Workshop roles (instructor, student) belong to one workshop and have
 * their own table below (WORKSHOP_ROLE_CAPABILITIES): a student is never a member of the studio.
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

/**
 * The one sign-in guard. Services and JSON routes call it with the caller alone and answer 401; pages and
 * their actions pass the page's URL, and an anonymous visitor is sent to sign in and brought back there.
 */
export function requireUser(user: SessionUser | null, signInFrom?: URL): SessionUser {
	if (user) return user;
	if (signInFrom) redirect(303, `/signin?callbackUrl=${encodeURIComponent(signInFrom.pathname + signInFrom.search)}`);
	error(401, 'Sign in first.');
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
	if (!can(access, capability)) refused(capability);
	return access;
}

function refused(capability: Capability): never {
	error(403, `Your role in this studio does not allow that (${capability}).`);
}

/**
 * The studios whose setups or gear the caller may use with `capability`, as a filter a query applies
 * in the database (no query of its own): every studio for a site admin, else the live studios where
 * the caller's role allows `capability`.
 */
export function studioFilter(user: SessionUser, capability: Capability): StudioFilter {
	if (user.isAdmin) return 'all';
	return { userId: user.id, roles: ROLE_ORDER.filter((role) => ROLE_CAPABILITIES[role].has(capability)) };
}

export const SETUP_NOT_FOUND = 'No such setup.';

export interface SetupAccess {
	setup: Setup;
	studioName: string;
	access: StudioAccess;
	/** What the caller may do here, so pages offer only what will work. */
	canEdit: boolean;
	canDuplicate: boolean;
}

/**
 * The caller's standing toward one setup: 401 when anonymous, 404 when the setup does not exist, is in
 * the trash, or lies in a studio the caller cannot see (never revealing which), 403 when the caller sees
 * it but their role lacks `capability`.
 */
export async function authorizeSetup(
	user: SessionUser | null,
	setupId: string,
	capability: Capability,
	{ includeTrashed = false } = {}
): Promise<SetupAccess> {
	const signedIn = requireUser(user);
	if (!isUuid(setupId)) error(404, SETUP_NOT_FOUND);
	// The setup, its studio and the caller's membership there in one query: every setup request asks this.
	const [row] = await db
		.select({ setup: setups, studioName: studios.name, personalOwnerId: studios.personalOwnerId, role: memberships.role })
		.from(setups)
		.innerJoin(studios, eq(studios.id, setups.studioId))
		.leftJoin(memberships, and(eq(memberships.studioId, setups.studioId), eq(memberships.userId, signedIn.id)))
		.where(and(eq(setups.id, setupId), isNull(studios.deletedAt), includeTrashed ? undefined : isNull(setups.deletedAt)));
	if (!row || (!row.role && !signedIn.isAdmin)) error(404, SETUP_NOT_FOUND);
	const access: StudioAccess = {
		studioId: row.setup.studioId,
		studioName: row.studioName,
		isPersonal: row.personalOwnerId !== null,
		role: row.role ?? null,
		isAdmin: signedIn.isAdmin
	};
	if (!can(access, 'setups.view')) error(404, SETUP_NOT_FOUND);
	if (!can(access, capability)) refused(capability);
	return {
		setup: row.setup,
		studioName: row.studioName,
		access,
		canEdit: can(access, 'setups.edit'),
		canDuplicate: can(access, 'setups.duplicateFrom')
	};
}

export const SHOT_NOT_FOUND = 'No such shot.';

/**
 * One shot of a setup: the setup's own answers first (401, 404 for a setup the caller may not see, so
 * its shots and their images are 404 too), then 404 for a shot that is not this setup's, or is in the
 * trash unless asked for, and 403 when the role lacks `capability`.
 */
export async function authorizeShot(
	user: SessionUser | null,
	setupId: string,
	shotId: string,
	capability: 'shots.view' | 'shots.edit',
	{ includeTrashed = false } = {}
) {
	const setupAccess = await authorizeSetup(user, setupId, 'shots.view');
	if (!isUuid(shotId)) error(404, SHOT_NOT_FOUND);
	const shot = await findShotRow(setupId, shotId);
	if (!shot || (shot.deletedAt && !includeTrashed)) error(404, SHOT_NOT_FOUND);
	if (!can(setupAccess.access, capability)) refused(capability);
	return { ...setupAccess, shot, canEditShots: can(setupAccess.access, 'shots.edit') };
}

export const GEAR_NOT_FOUND = 'No such gear.';

/** One gear item: 401 anonymous; 404 unknown or in a studio the caller cannot see; 403 when the role lacks the capability. */
export async function authorizeGear(user: SessionUser | null, gearId: string, capability: 'gear.view' | 'gear.edit') {
	const signedIn = requireUser(user);
	if (!isUuid(gearId)) error(404, GEAR_NOT_FOUND);
	const row = await findGearRow(gearId);
	if (!row) error(404, GEAR_NOT_FOUND);
	const access = await studioAccess(signedIn, row.studioId);
	if (!access || !can(access, 'gear.view')) error(404, GEAR_NOT_FOUND);
	if (!can(access, capability)) refused(capability);
	return { row, access, canEdit: can(access, 'gear.edit') };
}

// ---------- workshops ----------

export const WORKSHOP_CAPABILITIES = [
	/** The workshop, its sessions, lessons with their student notes, and each step's pinned revision as the step shows it. */
	'workshop.follow',
	/** Notes for the presenter. */
	'workshop.presenterNotes',
	/** Details, sessions, lessons, steps and the live position. */
	'workshop.run',
	/** Invitations, the roster and requests to join. */
	'workshop.roster',
	/** Adding and removing instructors; deleting the workshop. */
	'workshop.manage',
	/** Every student's hand-ins of the workshop's exercises: reading them, feedback, the gradebook. */
	'workshop.review',
	/** Starting an exercise and handing in: students only (their own hand-ins). */
	'workshop.handIn'
] as const;
export type WorkshopCapability = (typeof WORKSHOP_CAPABILITIES)[number];

const follower: WorkshopCapability[] = ['workshop.follow'];
const instructor: WorkshopCapability[] = [...follower, 'workshop.presenterNotes', 'workshop.run', 'workshop.roster', 'workshop.review'];
const runner = WORKSHOP_CAPABILITIES.filter((c) => c !== 'workshop.handIn');

/**
 * What each role may do in a workshop. Studio roles reach every workshop of their studio: owners and
 * editors run them, viewers read them as a student does. Workshop roles (a row in workshop_members)
 * reach that one workshop only, and never the studio's setups: a student reads exactly the revisions
 * the lessons pin, through the workshop.
 */
export const WORKSHOP_ROLE_CAPABILITIES: Record<StudioRole | WorkshopRole, ReadonlySet<WorkshopCapability>> = {
	viewer: new Set(follower),
	editor: new Set(runner),
	owner: new Set(runner),
	instructor: new Set(instructor),
	student: new Set([...follower, 'workshop.handIn'])
};

export const WORKSHOP_NOT_FOUND = 'No such workshop.';

export interface WorkshopAccess {
	workshop: Workshop;
	studioName: string;
	/** The caller's role in the workshop's studio, if any. */
	studioRole: StudioRole | null;
	/** The caller's own row in the workshop (instructor or student), if any. */
	workshopRole: WorkshopRole | null;
	workshopMemberId: string | null;
	isAdmin: boolean;
}

export function canInWorkshop(access: WorkshopAccess, capability: WorkshopCapability): boolean {
	if (access.isAdmin) return true;
	return [access.studioRole, access.workshopRole].some((role) => role !== null && WORKSHOP_ROLE_CAPABILITIES[role].has(capability));
}

/**
 * The caller's standing toward one workshop: 401 anonymous; 404 when it does not exist, its studio is
 * deleted, or the caller has no role that lets them follow it (never revealing which); 403 when they
 * may follow it but not do `capability`. A student of one workshop is a stranger to every other.
 */
export async function authorizeWorkshop(
	user: SessionUser | null,
	workshopId: string,
	capability: WorkshopCapability
): Promise<WorkshopAccess & { can: Record<WorkshopCapability, boolean> }> {
	const signedIn = requireUser(user);
	if (!isUuid(workshopId)) error(404, WORKSHOP_NOT_FOUND);
	const [row] = await db
		.select({
			workshop: workshops,
			studioName: studios.name,
			studioRole: memberships.role,
			workshopRole: workshopMembers.role,
			workshopMemberId: workshopMembers.id
		})
		.from(workshops)
		.innerJoin(studios, eq(studios.id, workshops.studioId))
		.leftJoin(memberships, and(eq(memberships.studioId, workshops.studioId), eq(memberships.userId, signedIn.id)))
		.leftJoin(workshopMembers, and(eq(workshopMembers.workshopId, workshops.id), eq(workshopMembers.userId, signedIn.id)))
		.where(and(eq(workshops.id, workshopId), isNull(studios.deletedAt)));
	if (!row) error(404, WORKSHOP_NOT_FOUND);
	const access: WorkshopAccess = {
		workshop: row.workshop,
		studioName: row.studioName,
		studioRole: row.studioRole ?? null,
		workshopRole: row.workshopRole ?? null,
		workshopMemberId: row.workshopMemberId ?? null,
		isAdmin: signedIn.isAdmin
	};
	if (!canInWorkshop(access, 'workshop.follow')) error(404, WORKSHOP_NOT_FOUND);
	if (!canInWorkshop(access, capability)) {
		error(403, `Your role in this workshop does not allow that (${capability}).`);
	}
	const can = Object.fromEntries(WORKSHOP_CAPABILITIES.map((c) => [c, canInWorkshop(access, c)])) as Record<WorkshopCapability, boolean>;
	return { ...access, can };
}

// ---------- exercises and hand-ins ----------

export const EXERCISE_NOT_FOUND = 'No such exercise.';
export const HAND_IN_NOT_FOUND = 'No such hand-in.';

/**
 * One exercise through its workshop: 404 for an exercise that does not exist, is not of `workshopId`
 * (when given: a URL names both), or whose workshop the caller may not follow; then the workshop's
 * answer for `capability`.
 */
export async function authorizeExercise(user: SessionUser | null, exerciseId: string, capability: WorkshopCapability, workshopId?: string) {
	const signedIn = requireUser(user);
	const exercise = isUuid(exerciseId) ? await findExerciseRow(exerciseId) : null;
	if (!exercise || (workshopId !== undefined && exercise.workshopId !== workshopId)) error(404, EXERCISE_NOT_FOUND);
	let access;
	try {
		access = await authorizeWorkshop(signedIn, exercise.workshopId, capability);
	} catch (e) {
		if (isHttpError(e) && e.status === 404) error(404, EXERCISE_NOT_FOUND);
		throw e;
	}
	return { exercise, access };
}

/**
 * One hand-in: its student reads their own; those who may review the workshop read and review every
 * hand-in of it. Anyone else, another student included, gets the same 404 as for a hand-in that does
 * not exist, and so does a hand-in asked for under another exercise or workshop than its own.
 */
export async function authorizeHandIn(
	user: SessionUser | null,
	handInId: string,
	want: 'read' | 'review',
	place: { workshopId?: string; exerciseId?: string } = {}
) {
	const signedIn = requireUser(user);
	const handIn = isUuid(handInId) ? await findHandInRow(handInId) : null;
	if (!handIn || (place.exerciseId !== undefined && handIn.exerciseId !== place.exerciseId)) error(404, HAND_IN_NOT_FOUND);
	let found;
	try {
		found = await authorizeExercise(signedIn, handIn.exerciseId, 'workshop.follow', place.workshopId);
	} catch (e) {
		if (isHttpError(e) && e.status === 404) error(404, HAND_IN_NOT_FOUND);
		throw e;
	}
	const reviews = found.access.can['workshop.review'];
	const own = handIn.userId === signedIn.id;
	if (!reviews && !own) error(404, HAND_IN_NOT_FOUND);
	if (want === 'review' && !reviews) error(403, 'Your role in this workshop does not allow that (workshop.review).');
	return { handIn, exercise: found.exercise, access: found.access, own, canReview: reviews };
}

/** The studios where the caller may run workshops (create one): owners and editors, or every studio for an admin. */
export function workshopStudioFilter(user: SessionUser): StudioFilter {
	if (user.isAdmin) return 'all';
	return { userId: user.id, roles: ROLE_ORDER.filter((role) => WORKSHOP_ROLE_CAPABILITIES[role].has('workshop.run')) };
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
