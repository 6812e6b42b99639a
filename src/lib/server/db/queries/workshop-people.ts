// Named queries of a workshop's people: the roster, invitations, joining (with its seat check) and
// requests to join. Services ask authz first and call these; a join runs in one transaction here.
import { and, asc, desc, eq, inArray, isNull, or, sql } from 'drizzle-orm';
import { db, type Tx } from '../index';
import { studios, users, workshopInvitations, workshopJoinRequests, workshopMembers, workshops, type WorkshopRole } from '../schema';
import { countSeatsTaken, type Runner } from './workshops';
import { invitationStanding, notAcceptedOrRevoked, stillOpen } from './invitations';

// ---------- people ----------

export async function listRoster(workshopId: string) {
	return db
		.select({
			id: workshopMembers.id,
			userId: users.id,
			name: users.name,
			email: users.email,
			role: workshopMembers.role,
			joinedAt: workshopMembers.joinedAt,
			lastSeenAt: workshopMembers.lastSeenAt
		})
		.from(workshopMembers)
		.innerJoin(users, eq(users.id, workshopMembers.userId))
		.where(eq(workshopMembers.workshopId, workshopId))
		.orderBy(asc(workshopMembers.role), asc(users.email));
}

export async function deleteMemberRow(workshopId: string, memberId: string) {
	const rows = await db
		.delete(workshopMembers)
		.where(and(eq(workshopMembers.id, memberId), eq(workshopMembers.workshopId, workshopId)))
		.returning({ id: workshopMembers.id });
	return rows.length > 0;
}

/** Notes that a member opened the workshop, at most once a minute. */
export async function touchMember(memberId: string) {
	await db
		.update(workshopMembers)
		.set({ lastSeenAt: new Date() })
		.where(
			and(
				eq(workshopMembers.id, memberId),
				or(isNull(workshopMembers.lastSeenAt), sql`${workshopMembers.lastSeenAt} < now() - interval '1 minute'`)
			)
		);
}

/** The roles held in a workshop by whoever has these addresses. */
export async function memberRolesByEmail(workshopId: string, emails: string[]) {
	if (!emails.length) return new Map<string, WorkshopRole>();
	const rows = await db
		.select({ email: users.email, role: workshopMembers.role })
		.from(workshopMembers)
		.innerJoin(users, eq(users.id, workshopMembers.userId))
		.where(and(eq(workshopMembers.workshopId, workshopId), inArray(users.email, emails)));
	return new Map(rows.map((r) => [r.email, r.role]));
}

export async function insertWorkshopInvitations(rows: (typeof workshopInvitations.$inferInsert)[]) {
	if (!rows.length) return [];
	return db.insert(workshopInvitations).values(rows).returning();
}

export async function listOpenWorkshopInvitations(workshopId: string) {
	return db
		.select({ id: workshopInvitations.id, email: workshopInvitations.email, role: workshopInvitations.role, expiresAt: workshopInvitations.expiresAt, createdAt: workshopInvitations.createdAt })
		.from(workshopInvitations)
		.where(and(eq(workshopInvitations.workshopId, workshopId), stillOpen(workshopInvitations)))
		.orderBy(desc(workshopInvitations.createdAt));
}

export async function revokeWorkshopInvitationRow(workshopId: string, invitationId: string) {
	const rows = await db
		.update(workshopInvitations)
		.set({ revokedAt: new Date() })
		.where(and(eq(workshopInvitations.id, invitationId), eq(workshopInvitations.workshopId, workshopId), notAcceptedOrRevoked(workshopInvitations)))
		.returning({ id: workshopInvitations.id });
	return rows.length > 0;
}

export async function findWorkshopInvitationByHash(tokenHash: string) {
	const [row] = await db
		.select({ invitation: workshopInvitations, workshop: workshops, studioDeletedAt: studios.deletedAt })
		.from(workshopInvitations)
		.innerJoin(workshops, eq(workshops.id, workshopInvitations.workshopId))
		.innerJoin(studios, eq(studios.id, workshops.studioId))
		.where(eq(workshopInvitations.tokenHash, tokenHash));
	return row ?? null;
}

export type JoinOutcome = 'joined' | 'already' | 'full' | 'gone';

/**
 * Adds someone to a workshop in one transaction with the workshop row locked: a student only while a
 * seat is left. `before` runs first inside the same transaction (marking an invitation used or a
 * request accepted) and may refuse with 'gone'.
 */
export async function addMember(
	workshopId: string,
	userId: string,
	role: WorkshopRole,
	before: (tx: Tx) => Promise<boolean> = async () => true
): Promise<JoinOutcome> {
	return db.transaction(async (tx) => {
		const [w] = await tx.select({ capacity: workshops.capacity }).from(workshops).where(eq(workshops.id, workshopId)).for('update');
		if (!w) return 'gone';
		const [existing] = await tx
			.select()
			.from(workshopMembers)
			.where(and(eq(workshopMembers.workshopId, workshopId), eq(workshopMembers.userId, userId)));
		if (existing && (existing.role === role || existing.role === 'instructor')) {
			return (await before(tx)) ? 'already' : 'gone';
		}
		if (role === 'student' && (await countSeatsTaken(workshopId, tx)).taken >= w.capacity) return 'full';
		if (!(await before(tx))) return 'gone';
		if (existing) await tx.update(workshopMembers).set({ role }).where(eq(workshopMembers.id, existing.id));
		else await tx.insert(workshopMembers).values({ workshopId, userId, role });
		return 'joined';
	});
}

/** Marks an open, unexpired invitation used (inside addMember's transaction); false when it is not open. */
export async function consumeWorkshopInvitation(tx: Tx, invitationId: string, userId: string): Promise<boolean> {
	const [inv] = await tx.select().from(workshopInvitations).where(eq(workshopInvitations.id, invitationId)).for('update');
	if (!inv || invitationStanding(inv) !== 'open') return false;
	await tx.update(workshopInvitations).set({ acceptedAt: new Date(), acceptedById: userId }).where(eq(workshopInvitations.id, inv.id));
	return true;
}

// ---------- requests to join ----------

export async function insertJoinRequest(workshopId: string, userId: string, message: string) {
	const rows = await db
		.insert(workshopJoinRequests)
		.values({ workshopId, userId, message })
		.onConflictDoNothing()
		.returning();
	return rows[0] ?? null;
}

export async function openJoinRequestOf(workshopId: string, userId: string) {
	const [row] = await db
		.select()
		.from(workshopJoinRequests)
		.where(and(eq(workshopJoinRequests.workshopId, workshopId), eq(workshopJoinRequests.userId, userId), isNull(workshopJoinRequests.decision)));
	return row ?? null;
}

export async function listOpenJoinRequests(workshopId: string) {
	return db
		.select({ id: workshopJoinRequests.id, userId: users.id, name: users.name, email: users.email, message: workshopJoinRequests.message, createdAt: workshopJoinRequests.createdAt })
		.from(workshopJoinRequests)
		.innerJoin(users, eq(users.id, workshopJoinRequests.userId))
		.where(and(eq(workshopJoinRequests.workshopId, workshopId), isNull(workshopJoinRequests.decision)))
		.orderBy(asc(workshopJoinRequests.createdAt));
}

export async function findOpenJoinRequest(workshopId: string, requestId: string) {
	const [row] = await db
		.select()
		.from(workshopJoinRequests)
		.where(and(eq(workshopJoinRequests.id, requestId), eq(workshopJoinRequests.workshopId, workshopId), isNull(workshopJoinRequests.decision)));
	return row ?? null;
}

/** Decides an open request (inside addMember's transaction for an acceptance); false when already decided. */
export async function decideJoinRequest(requestId: string, decision: 'accepted' | 'declined', deciderId: string, run: Runner = db): Promise<boolean> {
	const rows = await run
		.update(workshopJoinRequests)
		.set({ decision, decidedAt: new Date(), decidedById: deciderId })
		.where(and(eq(workshopJoinRequests.id, requestId), isNull(workshopJoinRequests.decision)))
		.returning({ id: workshopJoinRequests.id });
	return rows.length > 0;
}
