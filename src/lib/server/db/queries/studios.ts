import { and, asc, desc, eq, isNull, sql } from 'drizzle-orm';
import { db, type Tx } from '../index';
import { invitations, memberships, studios, users, type StudioRole } from '../schema';
import { outranks } from '$lib/server/authz';
import { invitationStanding, notAcceptedOrRevoked, stillOpen } from './invitations';

export async function createStudioWithOwner(name: string, ownerId: string, personal = false, tx?: Tx) {
	const run = async (t: Tx) => {
		const [studio] = await t
			.insert(studios)
			.values({ name, personalOwnerId: personal ? ownerId : null })
			.returning();
		await t.insert(memberships).values({ studioId: studio.id, userId: ownerId, role: 'owner' });
		return studio;
	};
	return tx ? run(tx) : db.transaction(run);
}

/** Makes the personal studio a user is owed, if it is not there yet (idempotent). */
export async function ensurePersonalStudio(userId: string, displayName: string) {
	const [existing] = await db.select().from(studios).where(eq(studios.personalOwnerId, userId));
	if (existing) return existing;
	return db.transaction(async (tx) => {
		const [again] = await tx.select().from(studios).where(eq(studios.personalOwnerId, userId)).for('update');
		if (again) return again;
		return createStudioWithOwner(`${displayName}'s studio`, userId, true, tx);
	});
}

/** The caller's live studios and their role in each, personal studio first; `withMemberCounts` adds each one's number of members. */
export async function listStudiosForUser(userId: string, { withMemberCounts = false } = {}) {
	return db
		.select({
			id: studios.id,
			name: studios.name,
			personal: sql<boolean>`${studios.personalOwnerId} is not null`,
			role: memberships.role,
			// Counted in a subquery whose own `memberships` is every member of the outer row's studio.
			members: withMemberCounts ? db.$count(memberships, eq(memberships.studioId, studios.id)) : sql<number | null>`null`
		})
		.from(memberships)
		.innerJoin(studios, eq(studios.id, memberships.studioId))
		.where(and(eq(memberships.userId, userId), isNull(studios.deletedAt)))
		.orderBy(desc(sql`${studios.personalOwnerId} is not null`), asc(studios.name));
}

export async function listMembers(studioId: string) {
	return db
		.select({
			id: memberships.id,
			userId: users.id,
			name: users.name,
			email: users.email,
			role: memberships.role,
			since: memberships.createdAt
		})
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(eq(memberships.studioId, studioId))
		.orderBy(asc(users.email));
}

export async function listOpenInvitations(studioId: string) {
	return db
		.select({
			id: invitations.id,
			email: invitations.email,
			role: invitations.role,
			expiresAt: invitations.expiresAt,
			createdAt: invitations.createdAt
		})
		.from(invitations)
		.where(and(eq(invitations.studioId, studioId), stillOpen(invitations)))
		.orderBy(desc(invitations.createdAt));
}

export async function renameStudioRow(studioId: string, name: string) {
	await db.update(studios).set({ name }).where(eq(studios.id, studioId));
}

export async function softDeleteStudio(studioId: string) {
	await db.update(studios).set({ deletedAt: new Date() }).where(eq(studios.id, studioId));
}

export async function insertInvitation(values: typeof invitations.$inferInsert) {
	const [row] = await db.insert(invitations).values(values).returning();
	return row;
}

export async function revokeInvitationRow(studioId: string, invitationId: string) {
	const rows = await db
		.update(invitations)
		.set({ revokedAt: new Date() })
		.where(and(eq(invitations.id, invitationId), eq(invitations.studioId, studioId), notAcceptedOrRevoked(invitations)))
		.returning({ id: invitations.id });
	return rows.length > 0;
}

export async function findInvitationByHash(tokenHash: string) {
	const [row] = await db
		.select({ invitation: invitations, studioName: studios.name, studioDeletedAt: studios.deletedAt })
		.from(invitations)
		.innerJoin(studios, eq(studios.id, invitations.studioId))
		.where(eq(invitations.tokenHash, tokenHash));
	return row ?? null;
}

export type MembershipChange =
	| { kind: 'role'; membershipId: string; role: StudioRole }
	| { kind: 'remove'; membershipId: string };

/**
 * Changes or removes a membership inside one transaction that locks the studio's memberships, so two
 * owners demoting each other at once cannot leave a studio without an owner.
 * Returns 'last-owner' when the change would leave none, 'missing' when the member is not there.
 */
export async function changeMembership(studioId: string, change: MembershipChange) {
	return db.transaction(async (tx) => {
		const rows = await tx
			.select({ id: memberships.id, role: memberships.role })
			.from(memberships)
			.where(eq(memberships.studioId, studioId))
			.for('update');
		const target = rows.find((r) => r.id === change.membershipId);
		if (!target) return 'missing' as const;
		const ownersAfter = rows.filter((r) => {
			if (r.id !== target.id) return r.role === 'owner';
			return change.kind === 'role' && change.role === 'owner';
		}).length;
		if (ownersAfter === 0) return 'last-owner' as const;
		if (change.kind === 'role') {
			await tx.update(memberships).set({ role: change.role }).where(eq(memberships.id, target.id));
		} else {
			await tx.delete(memberships).where(eq(memberships.id, target.id));
		}
		return 'done' as const;
	});
}

/**
 * Accepts an invitation once: marks it used and adds the membership, or raises an existing member to the
 * invited role (never lowers it), in one transaction.
 */
export async function consumeInvitation(invitationId: string, userId: string) {
	return db.transaction(async (tx) => {
		const [inv] = await tx.select().from(invitations).where(eq(invitations.id, invitationId)).for('update');
		if (!inv || invitationStanding(inv) !== 'open') return null;
		await tx
			.update(invitations)
			.set({ acceptedAt: new Date(), acceptedById: userId })
			.where(eq(invitations.id, inv.id));
		const [existing] = await tx
			.select()
			.from(memberships)
			.where(and(eq(memberships.studioId, inv.studioId), eq(memberships.userId, userId)))
			.for('update');
		if (!existing) {
			await tx.insert(memberships).values({ studioId: inv.studioId, userId, role: inv.role });
			return { studioId: inv.studioId, role: inv.role };
		}
		if (!outranks(inv.role, existing.role)) return { studioId: inv.studioId, role: existing.role };
		await tx.update(memberships).set({ role: inv.role }).where(eq(memberships.id, existing.id));
		return { studioId: inv.studioId, role: inv.role };
	});
}

export async function membershipOf(studioId: string, membershipId: string) {
	const [row] = await db
		.select()
		.from(memberships)
		.where(and(eq(memberships.studioId, studioId), eq(memberships.id, membershipId)));
	return row ?? null;
}

export async function membershipOfUser(studioId: string, userId: string) {
	const [row] = await db
		.select()
		.from(memberships)
		.where(and(eq(memberships.studioId, studioId), eq(memberships.userId, userId)));
	return row ?? null;
}

/** The role of whoever has this e-mail address in the studio, or null when they are not a member. */
export async function memberRoleByEmail(studioId: string, email: string): Promise<StudioRole | null> {
	const [row] = await db
		.select({ role: memberships.role })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(and(eq(memberships.studioId, studioId), eq(users.email, email)));
	return row?.role ?? null;
}
