// The authorization matrix, on the real database: every role against every studio action. Each allowed
// action must change the database as asked; each refused one must be refused with the right status and
// leave the database exactly as it was.
import { afterAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';

if (!process.env.DATABASE_URL) {
	throw new Error('DATABASE_URL is not set: these tests run against the real PostgreSQL (run them through `npm test`).');
}

const { client, db } = await import('$lib/server/db');
const { invitations, studios } = await import('$lib/server/db/schema');
const authz = await import('$lib/server/authz');
const studioRules = await import('$lib/server/studios');
const { attempt, makeUser, makeWorld, ROLES, snapshot } = await import('$lib/server/testing/authz-world');
type World = import('$lib/server/testing/authz-world').World;
type Role = import('$lib/server/testing/authz-world').Role;
type Snapshot = import('$lib/server/testing/authz-world').Snapshot;
type Outcome = import('$lib/server/testing/authz-world').Outcome;

type SessionUser = import('$lib/server/session').SessionUser;
type Capability = import('$lib/server/authz').Capability;

afterAll(async () => {
	await client.end({ timeout: 5 });
});

// ── the actions, what each does to the database when it is allowed

interface StudioAction {
	run(w: World, as: SessionUser | null): Promise<unknown>;
	/** Checks that the allowed action did what it says. */
	effect(w: World, before: Snapshot, after: Snapshot, result: unknown): void;
}

const newName = 'Small Light, Big Detail (renamed)';
const invitee = () => `pebble.finch+${randomUUID().slice(0, 8)}@fernhill.example`;
let lastInvitee = '';

const ACTIONS = {
	view: {
		run: (w, as) => studioRules.studioOverview(as, w.studioId),
		effect(w, before, after, result) {
			expect(after).toEqual(before);
			const overview = result as Awaited<ReturnType<typeof studioRules.studioOverview>>;
			expect(overview.access.studioId).toBe(w.studioId);
			expect(overview.members.map((m) => m.userId)).toEqual(expect.arrayContaining([w.founder.id, w.target.id]));
		}
	},
	rename: {
		run: (w, as) => studioRules.renameStudio(as, w.studioId, newName),
		effect(_w, before, after) {
			expect(before.studio.name).not.toBe(newName);
			expect(after.studio.name).toBe(newName);
			expect(after.members).toEqual(before.members);
		}
	},
	delete: {
		run: (w, as) => studioRules.deleteStudio(as, w.studioId),
		effect(_w, before, after) {
			expect(before.studio.deletedAt).toBeNull();
			expect(after.studio.deletedAt).toBeInstanceOf(Date);
		}
	},
	invite: {
		run: (w, as) => {
			lastInvitee = invitee();
			return studioRules.inviteToStudio(
				as,
				w.studioId,
				{ email: lastInvitee, role: 'editor' },
				{ origin: 'http://127.0.0.1', ip: `matrix-${randomUUID()}` }
			);
		},
		effect(_w, before, after) {
			expect(after.invites).toHaveLength(before.invites.length + 1);
			const made = after.invites.find((i) => i.email === lastInvitee);
			expect(made?.role).toBe('editor');
			expect(made?.acceptedAt).toBeNull();
			expect(made!.expiresAt.getTime()).toBeGreaterThan(Date.now());
		}
	},
	revokeInvitation: {
		run: (w, as) => studioRules.revokeInvitation(as, w.studioId, w.invitationId),
		effect(w, before, after) {
			expect(before.invites.find((i) => i.id === w.invitationId)?.revokedAt).toBeNull();
			expect(after.invites.find((i) => i.id === w.invitationId)?.revokedAt).toBeInstanceOf(Date);
		}
	},
	changeRole: {
		run: (w, as) => studioRules.changeMemberRole(as, w.studioId, w.targetMembershipId, 'editor'),
		effect(w, before, after) {
			expect(before.members.find((m) => m.id === w.targetMembershipId)?.role).toBe('viewer');
			expect(after.members.find((m) => m.id === w.targetMembershipId)?.role).toBe('editor');
			expect(after.members).toHaveLength(before.members.length);
		}
	},
	removeMember: {
		run: (w, as) => studioRules.removeMember(as, w.studioId, w.targetMembershipId),
		effect(w, before, after) {
			expect(before.members.some((m) => m.id === w.targetMembershipId)).toBe(true);
			expect(after.members.some((m) => m.id === w.targetMembershipId)).toBe(false);
			expect(after.members).toHaveLength(before.members.length - 1);
		}
	},
	leave: {
		run: (w, as) => studioRules.leaveStudio(as, w.studioId),
		effect(w, before, after) {
			expect(before.members.some((m) => m.userId === w.actor.id)).toBe(true);
			expect(after.members.some((m) => m.userId === w.actor.id)).toBe(false);
			expect(after.members.filter((m) => m.role === 'owner').length).toBeGreaterThanOrEqual(1);
		}
	}
} satisfies Record<string, StudioAction>;
type ActionName = keyof typeof ACTIONS;
const perform = (action: ActionName, w: World, as: SessionUser | null) => (ACTIONS[action] as StudioAction).run(w, as);
const effectOf = (action: ActionName): StudioAction['effect'] => (ACTIONS[action] as StudioAction).effect;

/**
 * What the product promises (issue 2, Studios and roles): owners do everything, editors and viewers only
 * read the studio itself, a signed-in stranger is told the studio does not exist (404), and the site admin
 * manages every studio without being a member (so has nothing to leave).
 */
const EXPECTED: Record<ActionName, Record<Role, Outcome>> = {
	view: { none: 404, viewer: 'ok', editor: 'ok', owner: 'ok', admin: 'ok' },
	rename: { none: 404, viewer: 403, editor: 403, owner: 'ok', admin: 'ok' },
	delete: { none: 404, viewer: 403, editor: 403, owner: 'ok', admin: 'ok' },
	invite: { none: 404, viewer: 403, editor: 403, owner: 'ok', admin: 'ok' },
	revokeInvitation: { none: 404, viewer: 403, editor: 403, owner: 'ok', admin: 'ok' },
	changeRole: { none: 404, viewer: 403, editor: 403, owner: 'ok', admin: 'ok' },
	removeMember: { none: 404, viewer: 403, editor: 403, owner: 'ok', admin: 'ok' },
	leave: { none: 404, viewer: 'ok', editor: 'ok', owner: 'ok', admin: 'rule' }
};

describe('authorization matrix: role × studio action', () => {
	for (const action of Object.keys(ACTIONS) as ActionName[]) {
		for (const role of ROLES) {
			const expected = EXPECTED[action][role];
			it(`${role} → ${action}: ${expected === 'ok' ? 'allowed' : `refused (${expected})`}`, async () => {
				const w = await makeWorld(role);
				const before = await snapshot(w.studioId);
				const { outcome, result } = await attempt(() => perform(action, w, w.actor));
				const after = await snapshot(w.studioId);
				expect(outcome).toBe(expected);
				if (expected === 'ok') effectOf(action)(w, before, after, result);
				else expect(after).toEqual(before);
			});
		}
	}

	it('anonymous callers get 401 for every action and change nothing', async () => {
		const w = await makeWorld('none');
		const before = await snapshot(w.studioId);
		for (const action of Object.keys(ACTIONS) as ActionName[]) {
			const { outcome } = await attempt(() => perform(action, w, null));
			expect(outcome, action).toBe(401);
		}
		expect(await snapshot(w.studioId)).toEqual(before);
	});

	it('a deleted studio is gone for everyone, the admin included (404)', async () => {
		for (const role of ['owner', 'admin'] as const) {
			const w = await makeWorld(role);
			await db.update(studios).set({ deletedAt: new Date() }).where(eq(studios.id, w.studioId));
			const before = await snapshot(w.studioId);
			for (const action of Object.keys(ACTIONS) as ActionName[]) {
				const { outcome } = await attempt(() => perform(action, w, w.actor));
				expect(outcome, `${role} ${action}`).toBe(404);
			}
			expect(await snapshot(w.studioId)).toEqual(before);
		}
	});

	it('a studio id that is not a uuid is a 404, not a 500', async () => {
		const w = await makeWorld('owner');
		const { outcome } = await attempt(() => studioRules.studioOverview(w.actor, "1' or '1'='1"));
		expect(outcome).toBe(404);
	});

	it('only owners and the admin see open invitations on the studio page', async () => {
		for (const role of ['viewer', 'editor', 'owner', 'admin'] as const) {
			const w = await makeWorld(role);
			const overview = await studioRules.studioOverview(w.actor, w.studioId);
			const manages = role === 'owner' || role === 'admin';
			expect(overview.canManage, role).toBe(manages);
			expect(overview.invitations.map((i) => i.id), role).toEqual(manages ? [w.invitationId] : []);
		}
	});
});

describe('capabilities through authz.can', () => {
	const viewer: Capability[] = ['studio.view', 'members.view', 'setups.view', 'setups.duplicateFrom', 'gear.view', 'shots.view'];
	const editor: Capability[] = [...viewer, 'setups.edit', 'gear.edit', 'shots.edit'];
	const all: Capability[] = [...editor, 'studio.rename', 'studio.delete', 'members.manage', 'invitations.manage'];
	const allowed: Record<Role, Capability[]> = { none: [], viewer, editor, owner: all, admin: all };

	it('the table below names every capability authz knows', () => {
		expect([...authz.CAPABILITIES].sort()).toEqual([...all].sort());
	});

	for (const role of ROLES) {
		it(`${role}: exactly ${allowed[role].length} of ${all.length} capabilities`, async () => {
			const w = await makeWorld(role);
			const access = await authz.studioAccess(w.actor, w.studioId);
			if (role === 'none') expect(access).toBeNull();
			else expect(access?.role ?? null).toBe(role === 'admin' ? null : role);
			for (const capability of authz.CAPABILITIES) {
				expect(authz.can(access, capability), `${role} ${capability}`).toBe(allowed[role].includes(capability));
				const { outcome } = await attempt(() => authz.authorizeStudio(w.actor, w.studioId, capability));
				const expected: Outcome = role === 'none' ? 404 : allowed[role].includes(capability) ? 'ok' : 403;
				expect(outcome, `authorizeStudio ${role} ${capability}`).toBe(expected);
			}
		});
	}
});

describe('personal studios', () => {
	it('cannot be deleted or left, even by their owner, and cannot take invitations', async () => {
		const me = await makeUser('mara.quill');
		const [personal] = await db.select().from(studios).where(eq(studios.personalOwnerId, me.id));
		const before = await snapshot(personal.id);
		const del = await attempt(() => studioRules.deleteStudio(me, personal.id));
		expect(del.outcome).toBe('rule');
		expect((del.error as Error).message).toMatch(/personal studio cannot be deleted/i);
		const leave = await attempt(() => studioRules.leaveStudio(me, personal.id));
		expect(leave.outcome).toBe('rule');
		expect((leave.error as Error).message).toMatch(/cannot leave your personal studio/i);
		const invite = await attempt(() =>
			studioRules.inviteToStudio(me, personal.id, { email: invitee(), role: 'viewer' }, { origin: 'http://127.0.0.1', ip: randomUUID() })
		);
		expect(invite.outcome).toBe('rule');
		expect((invite.error as Error).message).toMatch(/personal studio/i);
		expect(await snapshot(personal.id)).toEqual(before);
	});
});

// ── setups and gear: authorizeSetup and authorizeGear, the same roles against one setup and one gear item
