// The people of a workshop: invitations by e-mail (single use, expiring), the roster, requests to join
// from the public page. A seat is taken only in one transaction with the workshop row locked, so the
// students never outnumber the capacity.
import { error } from '@sveltejs/kit';
import { authorizeWorkshop, requireUser } from '$lib/server/authz';
import { RuleViolation } from '$lib/server/errors';
import { sendMail } from '$lib/server/mail';
import { workshopInvitationLetter } from '$lib/server/mail/letters';
import { hashSecret, newSecret } from '$lib/server/tokens';
import type { SessionUser } from '$lib/server/session';
import type { WorkshopRole } from '$lib/server/db/schema';
import { hitRateLimits } from '$lib/server/db/queries/rate-limits';
import { invitationStanding } from '$lib/server/db/queries/invitations';
import {
	addMember,
	consumeWorkshopInvitation,
	decideJoinRequest,
	deleteMemberRow,
	findOpenJoinRequest,
	findWorkshopInvitationByHash,
	insertJoinRequest,
	insertWorkshopInvitations,
	listOpenJoinRequests,
	listOpenWorkshopInvitations,
	listRoster,
	memberRolesByEmail,
	revokeWorkshopInvitationRow
} from '$lib/server/db/queries/workshop-people';
import { countSeatsTaken, findPublishedWorkshopBySlug } from '$lib/server/db/queries/workshops';
import { isUuid } from '$lib/uuid';
import { MAX_INVITATIONS_AT_ONCE, type AddressList } from '$lib/workshops/addresses';

export const WORKSHOP_INVITATION_DAYS = 14;

export interface InvitationReport {
	/** Invited and mailed. */
	sent: string[];
	/** Entries that are not addresses, each with why. */
	invalid: { entry: string; message: string }[];
	/** Addresses of people already in the workshop. */
	skipped: { email: string; message: string }[];
	/** Addresses whose mail could not be sent (their invitations were withdrawn). */
	failed: { email: string; message: string }[];
}

/**
 * Invites every good address of the list and mails each its own link; the bad entries are named and
 * the rest still go out. A list with no good address at all is refused, naming the field.
 */
export async function inviteToWorkshop(
	user: SessionUser | null,
	workshopId: string,
	input: { addresses: AddressList; role?: WorkshopRole },
	context: { origin: string; ip: string }
): Promise<InvitationReport> {
	const role = input.role ?? 'student';
	const access = await authorizeWorkshop(user, workshopId, role === 'instructor' ? 'workshop.manage' : 'workshop.roster');
	const { valid, invalid } = input.addresses;
	if (!valid.length) {
		const named = invalid.length ? `: ${invalid.map((i) => `“${i.entry}” (${i.message})`).join('; ')}` : '';
		throw new RuleViolation(`No address to invite${named}.`, 'emails');
	}
	if (valid.length > MAX_INVITATIONS_AT_ONCE) {
		throw new RuleViolation(`At most ${MAX_INVITATIONS_AT_ONCE} addresses at once; this list has ${valid.length}.`, 'emails');
	}
	const limits = await hitRateLimits([{ bucket: `workshop-invite:ip:${context.ip}`, limit: 60, windowMs: 3600_000 }]);
	if (!limits.allowed) throw new RuleViolation('Too many invitations were sent just now. Wait an hour and try again.', 'emails', 429);

	const already = await memberRolesByEmail(access.workshop.id, valid);
	const skipped = valid
		.filter((e) => already.get(e) === role || already.get(e) === 'instructor')
		.map((email) => ({ email, message: `already in this workshop as ${already.get(email)}` }));
	const toInvite = valid.filter((e) => !skipped.some((s) => s.email === e));
	const expiresAt = new Date(Date.now() + WORKSHOP_INVITATION_DAYS * 24 * 3600_000);
	const tokens = new Map(toInvite.map((email) => [email, newSecret()]));
	const rows = await insertWorkshopInvitations(
		toInvite.map((email) => ({
			workshopId: access.workshop.id,
			email,
			role,
			tokenHash: hashSecret(tokens.get(email)!),
			invitedById: user!.id,
			expiresAt
		}))
	);
	const sent: string[] = [];
	const failed: InvitationReport['failed'] = [];
	const inviter = user!.name || user!.email;
	for (const row of rows) {
		const url = `${context.origin}/workshops/join/${tokens.get(row.email)}`;
		try {
			await sendMail(workshopInvitationLetter(row.email, url, access.workshop.title, inviter, role, expiresAt));
			sent.push(row.email);
		} catch (e) {
			// A link nobody received must not stay open.
			await revokeWorkshopInvitationRow(access.workshop.id, row.id);
			failed.push({ email: row.email, message: e instanceof Error ? e.message : 'the mail server refused it' });
		}
	}
	return { sent, invalid, skipped, failed };
}

export async function revokeWorkshopInvitation(user: SessionUser | null, workshopId: string, invitationId: string) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.roster');
	if (!isUuid(invitationId) || !(await revokeWorkshopInvitationRow(access.workshop.id, invitationId))) {
		throw new RuleViolation('That invitation is no longer open.', 'invitation');
	}
}

export interface RosterEntry {
	id: string;
	name: string | null;
	email: string;
	role: WorkshopRole;
	joinedAt: string;
	lastSeenAt: string | null;
}

/** The roster with open invitations and requests to join, for those who keep it. */
export async function workshopRoster(user: SessionUser | null, workshopId: string) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.roster');
	const [people, invitations, requests, seats] = await Promise.all([
		listRoster(access.workshop.id),
		listOpenWorkshopInvitations(access.workshop.id),
		listOpenJoinRequests(access.workshop.id),
		countSeatsTaken(access.workshop.id)
	]);
	return {
		access,
		enrolled: seats.students,
		held: seats.held,
		seatsLeft: Math.max(0, access.workshop.capacity - seats.taken),
		people: people.map(
			(p): RosterEntry => ({
				id: p.id,
				name: p.name,
				email: p.email,
				role: p.role,
				joinedAt: p.joinedAt.toISOString(),
				lastSeenAt: p.lastSeenAt ? p.lastSeenAt.toISOString() : null
			})
		),
		invitations: invitations.map((i) => ({ id: i.id, email: i.email, role: i.role, expiresAt: i.expiresAt.toISOString() })),
		requests: requests.map((r) => ({ id: r.id, name: r.name, email: r.email, message: r.message, createdAt: r.createdAt.toISOString() }))
	};
}

/** Removes a student (roster keepers) or an instructor (studio owners and editors only). */
export async function removeFromWorkshop(user: SessionUser | null, workshopId: string, memberId: string) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.roster');
	const roster = await listRoster(access.workshop.id);
	const member = roster.find((p) => p.id === memberId);
	if (!member) throw new RuleViolation('That person is not in this workshop.', 'member');
	if (member.role === 'instructor' && !access.can['workshop.manage']) {
		error(403, 'Only the studio’s owners and editors may remove an instructor (workshop.manage).');
	}
	if (!(await deleteMemberRow(access.workshop.id, memberId))) throw new RuleViolation('That person is not in this workshop.', 'member');
}

export type WorkshopInvitationState =
	| { state: 'open'; workshopId: string; workshopTitle: string; role: WorkshopRole; email: string; expiresAt: Date }
	| { state: 'used' | 'expired' | 'revoked' | 'unknown' };

async function invitationByToken(token: string) {
	const row = token.length > 20 && token.length < 100 ? await findWorkshopInvitationByHash(hashSecret(token)) : null;
	return row && !row.studioDeletedAt ? row : null;
}

export async function lookUpWorkshopInvitation(token: string): Promise<WorkshopInvitationState> {
	const row = await invitationByToken(token);
	if (!row) return { state: 'unknown' };
	const inv = row.invitation;
	const state = invitationStanding(inv);
	if (state !== 'open') return { state };
	return { state, workshopId: row.workshop.id, workshopTitle: row.workshop.title, role: inv.role, email: inv.email, expiresAt: inv.expiresAt };
}

/** Uses an invitation once: the signed-in person must hold the invited address; a student needs a free seat. */
export async function acceptWorkshopInvitation(user: SessionUser | null, token: string): Promise<{ workshopId: string; role: WorkshopRole }> {
	const signedIn = requireUser(user);
	const row = await invitationByToken(token);
	if (!row) error(404, 'No such invitation.');
	const inv = row.invitation;
	if (inv.email !== signedIn.email) {
		throw new RuleViolation('This invitation was sent to another address. Sign in as that address to accept it.', 'email');
	}
	const outcome = await addMember(row.workshop.id, signedIn.id, inv.role, (tx) => consumeWorkshopInvitation(tx, inv.id, signedIn.id));
	if (outcome === 'full') throw new RuleViolation('The workshop is full: ask the instructor to make room.', 'invitation', 409);
	if (outcome === 'gone') throw new RuleViolation('This invitation has expired or has already been used.', 'invitation', 410);
	return { workshopId: row.workshop.id, role: inv.role };
}

/** "Ask to join" from the public page of a published workshop. */
export async function askToJoin(user: SessionUser | null, slug: string, message: string) {
	const signedIn = requireUser(user);
	const row = slug.length <= 100 ? await findPublishedWorkshopBySlug(slug) : null;
	if (!row) error(404, 'No such workshop.');
	const roles = await memberRolesByEmail(row.workshop.id, [signedIn.email]);
	if (roles.size) throw new RuleViolation('You are already in this workshop.', 'form');
	if (row.workshop.priceMinor > 0) throw new RuleViolation('Seats in this workshop are paid: book a seat instead.', 'form');
	if ((await countSeatsTaken(row.workshop.id)).taken >= row.workshop.capacity) {
		throw new RuleViolation('The workshop is full.', 'form');
	}
	const request = await insertJoinRequest(row.workshop.id, signedIn.id, message);
	if (!request) throw new RuleViolation('You have already asked to join; the instructor will answer on the roster.', 'form');
	return request;
}

/** The instructor's answer to a request to join: accepting takes a seat (or is refused when none is left). */
export async function answerJoinRequest(user: SessionUser | null, workshopId: string, requestId: string, decision: 'accepted' | 'declined') {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.roster');
	const request = isUuid(requestId) ? await findOpenJoinRequest(access.workshop.id, requestId) : null;
	if (!request) throw new RuleViolation('That request has already been answered.', 'request');
	if (decision === 'declined') {
		if (!(await decideJoinRequest(request.id, 'declined', user!.id))) throw new RuleViolation('That request has already been answered.', 'request');
		return;
	}
	const outcome = await addMember(access.workshop.id, request.userId, 'student', (tx) => decideJoinRequest(request.id, 'accepted', user!.id, tx));
	if (outcome === 'full') throw new RuleViolation('No seat is left: raise the capacity first.', 'request', 409);
	if (outcome === 'gone') throw new RuleViolation('That request has already been answered.', 'request');
}
