// A studio world for the authorisation tests, on the real database: our own users and studios, with
// random addresses, so no test leans on another or on the seed.
import { isHttpError } from '@sveltejs/kit';
import { randomUUID } from 'node:crypto';
import { asc, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { invitations, memberships, studios, users } from '$lib/server/db/schema';
import { ensurePersonalStudio } from '$lib/server/db/queries/studios';
import { toSessionUser } from '$lib/server/db/queries/users';
import { hashSecret, newSecret } from '$lib/server/tokens';
import { RuleViolation } from '$lib/server/errors';
import type { SessionUser } from '$lib/server/session';


export async function makeUser(label: string, isAdmin = false): Promise<SessionUser> {
	const email = `${label}+${randomUUID().slice(0, 8)}@fernhill.example`;
	const [row] = await db.insert(users).values({ email, name: label, isAdmin, emailVerified: new Date() }).returning();
	await ensurePersonalStudio(row.id, label);
	return toSessionUser(row);
}

export const ROLES = ['none', 'viewer', 'editor', 'owner', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export interface World {
	studioId: string;
	founder: SessionUser;
	actor: SessionUser;
	/** A viewer who is not the actor: the one whose role is changed or who is removed. */
	target: SessionUser;
	targetMembershipId: string;
	invitationId: string;
}

/** A shared studio with a founding owner, a viewer, one open invitation and the actor in `role`. */
export async function makeWorld(role: Role): Promise<World> {
	const founder = await makeUser('mara.quill');
	const target = await makeUser('tobias.wren');
	const actor = await makeUser(`actor.${role}`, role === 'admin');
	const [studio] = await db.insert(studios).values({ name: `Fernhill Geology Circle ${randomUUID().slice(0, 6)}` }).returning();
	await db.insert(memberships).values({ studioId: studio.id, userId: founder.id, role: 'owner' });
	const [targetMembership] = await db
		.insert(memberships)
		.values({ studioId: studio.id, userId: target.id, role: 'viewer' })
		.returning();
	if (role === 'viewer' || role === 'editor' || role === 'owner') {
		await db.insert(memberships).values({ studioId: studio.id, userId: actor.id, role });
	}
	const [invitation] = await db
		.insert(invitations)
		.values({
			studioId: studio.id,
			email: `ines.marlow+${randomUUID().slice(0, 8)}@fernhill.example`,
			role: 'viewer',
			tokenHash: hashSecret(newSecret()),
			invitedById: founder.id,
			expiresAt: new Date(Date.now() + 24 * 3600_000)
		})
		.returning();
	return {
		studioId: studio.id,
		founder,
		actor,
		target,
		targetMembershipId: targetMembership.id,
		invitationId: invitation.id
	};
}

export async function snapshot(studioId: string) {
	const [studio] = await db.select().from(studios).where(eq(studios.id, studioId));
	const members = await db
		.select({ id: memberships.id, userId: memberships.userId, role: memberships.role })
		.from(memberships)
		.where(eq(memberships.studioId, studioId))
		.orderBy(asc(memberships.id));
	const invites = await db.select().from(invitations).where(eq(invitations.studioId, studioId)).orderBy(asc(invitations.id));
	return { studio, members, invites };
}
export type Snapshot = Awaited<ReturnType<typeof snapshot>>;

export type Outcome = 'ok' | 401 | 403 | 404 | 'rule';

export async function attempt<T>(work: () => Promise<T>): Promise<{ outcome: Outcome; result?: T; error?: unknown }> {
	try {
		return { outcome: 'ok', result: await work() };
	} catch (e) {
		if (isHttpError(e) && (e.status === 401 || e.status === 403 || e.status === 404)) {
			return { outcome: e.status, error: e };
		}
		if (e instanceof RuleViolation) return { outcome: 'rule', error: e };
		throw e;
	}
}

