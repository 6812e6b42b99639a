// Studio rules: who may do what is asked of authz; what must stay true (an owner always remains,
// an invitation works once and expires) is kept here.
import { error } from '@sveltejs/kit';
import { authorizeStudio, can, isUuid, outranks, requireUser } from '$lib/server/authz';
import { RuleViolation } from '$lib/server/errors';
import { sendMail } from '$lib/server/mail';
import { invitationLetter } from '$lib/server/mail/letters';
import { hashSecret, newSecret } from '$lib/server/tokens';
import type { SessionUser } from '$lib/server/session';
import type { StudioRole } from '$lib/server/db/schema';
import {
	changeMembership,
	consumeInvitation,
	createStudioWithOwner,
	findInvitationByHash,
	insertInvitation,
	listMembers,
	listOpenInvitations,
	listStudiosForUser,
	memberRoleByEmail,
	membershipOf,
	membershipOfUser,
	renameStudioRow,
	revokeInvitationRow,
	softDeleteStudio
} from '$lib/server/db/queries/studios';
import { hitRateLimits } from '$lib/server/db/queries/rate-limits';
import { invitationStanding } from '$lib/server/db/queries/invitations';

export const INVITATION_DAYS = 7;

/** The caller's studios and role in each; the studios page also asks how many members each has. */
export async function myStudios(user: SessionUser | null, options: { withMemberCounts?: boolean } = {}) {
	return listStudiosForUser(requireUser(user).id, options);
}

export async function createStudio(user: SessionUser | null, name: string) {
	return createStudioWithOwner(name, requireUser(user).id);
}

export async function studioOverview(user: SessionUser | null, studioId: string) {
	const access = await authorizeStudio(user, studioId, 'studio.view');
	const members = await listMembers(studioId);
	const canManage = can(access, 'members.manage');
	const invitations = canManage ? await listOpenInvitations(studioId) : [];
	return { access, members, invitations, canManage };
}

export async function renameStudio(user: SessionUser | null, studioId: string, name: string) {
	await authorizeStudio(user, studioId, 'studio.rename');
	await renameStudioRow(studioId, name);
}

export async function deleteStudio(user: SessionUser | null, studioId: string) {
	const access = await authorizeStudio(user, studioId, 'studio.delete');
	if (access.isPersonal) throw new RuleViolation('A personal studio cannot be deleted.', 'studio');
	await softDeleteStudio(studioId);
}

export async function inviteToStudio(
	user: SessionUser | null,
	studioId: string,
	input: { email: string; role: StudioRole },
	context: { origin: string; ip: string }
) {
	const access = await authorizeStudio(user, studioId, 'invitations.manage');
	if (access.isPersonal) {
		throw new RuleViolation('A personal studio is yours alone. Make a shared studio to invite people.', 'email');
	}
	// An invitation can raise an existing member's role when accepted; one that could not is refused here.
	const currentRole = await memberRoleByEmail(studioId, input.email);
	if (currentRole && !outranks(input.role, currentRole)) {
		throw new RuleViolation(
			`${input.email} is already a member of this studio as ${currentRole}. Change their role in the member list instead.`,
			'email'
		);
	}
	const limits = await hitRateLimits([
		{ bucket: `invite:addr:${input.email}`, limit: 5, windowMs: 3600_000 },
		{ bucket: `invite:ip:${context.ip}`, limit: 30, windowMs: 3600_000 }
	]);
	if (!limits.allowed) {
		throw new RuleViolation('Too many invitations were sent just now. Wait an hour and try again.', 'email', 429);
	}
	const token = newSecret();
	const expiresAt = new Date(Date.now() + INVITATION_DAYS * 24 * 3600_000);
	const invitation = await insertInvitation({
		studioId,
		email: input.email,
		role: input.role,
		tokenHash: hashSecret(token),
		invitedById: user!.id,
		expiresAt
	});
	const url = `${context.origin}/invitations/${token}`;
	await sendMail(
		invitationLetter(input.email, url, access.studioName, user!.name || user!.email, input.role, expiresAt)
	);
	return invitation;
}

export async function revokeInvitation(user: SessionUser | null, studioId: string, invitationId: string) {
	await authorizeStudio(user, studioId, 'invitations.manage');
	if (!isUuid(invitationId) || !(await revokeInvitationRow(studioId, invitationId))) {
		throw new RuleViolation('That invitation is no longer open.', 'invitation');
	}
}

export async function changeMemberRole(
	user: SessionUser | null,
	studioId: string,
	membershipId: string,
	role: StudioRole
) {
	await authorizeStudio(user, studioId, 'members.manage');
	await applyMembershipChange(studioId, { kind: 'role', membershipId, role });
}

export async function removeMember(user: SessionUser | null, studioId: string, membershipId: string) {
	await authorizeStudio(user, studioId, 'members.manage');
	await applyMembershipChange(studioId, { kind: 'remove', membershipId });
}

/** Any member may leave, except the last owner. */
export async function leaveStudio(user: SessionUser | null, studioId: string) {
	const access = await authorizeStudio(user, studioId, 'studio.view');
	if (access.isPersonal) throw new RuleViolation('You cannot leave your personal studio.', 'studio');
	const own = await membershipOfUser(studioId, user!.id);
	if (!own) throw new RuleViolation('You are not a member of this studio.', 'studio');
	await applyMembershipChange(studioId, { kind: 'remove', membershipId: own.id });
}

async function applyMembershipChange(
	studioId: string,
	change: Parameters<typeof changeMembership>[1]
) {
	if (!isUuid(change.membershipId) || !(await membershipOf(studioId, change.membershipId))) {
		throw new RuleViolation('That person is not a member of this studio.', 'member');
	}
	const outcome = await changeMembership(studioId, change);
	if (outcome === 'last-owner') {
		throw new RuleViolation('A studio must keep at least one owner: make someone else owner first.', 'role');
	}
	if (outcome === 'missing') throw new RuleViolation('That person is not a member of this studio.', 'member');
}

export type InvitationState =
	| { state: 'open'; studioName: string; role: StudioRole; email: string; expiresAt: Date }
	| { state: 'used' | 'expired' | 'revoked' | 'unknown' };

export async function lookUpInvitation(token: string): Promise<InvitationState> {
	const row = token.length > 20 && token.length < 100 ? await findInvitationByHash(hashSecret(token)) : null;
	if (!row || row.studioDeletedAt) return { state: 'unknown' };
	const inv = row.invitation;
	const state = invitationStanding(inv);
	if (state !== 'open') return { state };
	return { state, studioName: row.studioName, role: inv.role, email: inv.email, expiresAt: inv.expiresAt };
}

export async function acceptInvitation(user: SessionUser | null, token: string) {
	const signedIn = requireUser(user);
	const row = token.length > 20 && token.length < 100 ? await findInvitationByHash(hashSecret(token)) : null;
	if (!row || row.studioDeletedAt) error(404, 'No such invitation.');
	const inv = row.invitation;
	if (inv.email !== signedIn.email) {
		throw new RuleViolation(
			`This invitation was sent to another address. Sign in as that address to accept it.`,
			'email'
		);
	}
	const result = await consumeInvitation(inv.id, signedIn.id);
	if (!result) throw new RuleViolation('This invitation has expired or has already been used.', 'invitation', 410);
	return result;
}
