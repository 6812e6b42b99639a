// authorizeSetup, authorizeGear and requireUser on the real database: every role against viewing and
// editing one setup and one gear item, and the answers for anonymous callers and ids out of sight.
import { afterAll, describe, expect, it } from 'vitest';
import { isRedirect } from '@sveltejs/kit';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';

if (!process.env.DATABASE_URL) {
	throw new Error('DATABASE_URL is not set: these tests run against the real PostgreSQL (run them through `npm test`).');
}

const { client, db } = await import('$lib/server/db');
const { studios } = await import('$lib/server/db/schema');
const authz = await import('$lib/server/authz');
const { attempt, makeUser, makeWorld, ROLES } = await import('$lib/server/testing/authz-world');
type Role = import('$lib/server/testing/authz-world').Role;
type Outcome = import('$lib/server/testing/authz-world').Outcome;

afterAll(async () => {
	await client.end({ timeout: 5 });
});

describe('authorizeSetup and authorizeGear: role × capability', () => {
	const { authorizeGear, authorizeSetup, requireUser } = authz;

	async function worldWithSetupAndGear(role: Role) {
		const w = await makeWorld(role);
		const { createSetup } = await import('$lib/server/setups');
		const { createGear } = await import('$lib/server/gear');
		const { setupCreateSchema } = await import('$lib/scene/inputs');
		const { sampleDocument } = await import('$lib/server/testing/notebook-fixtures');
		const setup = await createSetup(
			w.founder,
			setupCreateSchema.parse({ studioId: w.studioId, title: 'Ammonite on slate', subject: 'Ammonite', document: sampleDocument() })
		);
		const gearItem = await createGear(w.founder, {
			studioId: w.studioId,
			kind: 'reflector',
			name: 'White card',
			spec: { widthM: 0.2, heightM: 0.3, reflectance: 0.9, surface: 'diffuse' },
			notes: ''
		});
		return { ...w, setupId: setup.id, gearId: gearItem.id };
	}

	/** Issue 2's roles applied to setups and gear: viewers read, editors and owners edit, strangers see nothing. */
	const EXPECTED_ITEM: Record<'view' | 'edit', Record<Role, Outcome>> = {
		view: { none: 404, viewer: 'ok', editor: 'ok', owner: 'ok', admin: 'ok' },
		edit: { none: 404, viewer: 403, editor: 'ok', owner: 'ok', admin: 'ok' }
	};

	for (const role of ROLES) {
		it(`${role}: a setup and a gear item answer as the role allows, and say whether the caller may edit`, async () => {
			const w = await worldWithSetupAndGear(role);
			for (const level of ['view', 'edit'] as const) {
				const expected = EXPECTED_ITEM[level][role];
				const setup = await attempt(() => authorizeSetup(w.actor, w.setupId, level === 'view' ? 'setups.view' : 'setups.edit'));
				const gearItem = await attempt(() => authorizeGear(w.actor, w.gearId, level === 'view' ? 'gear.view' : 'gear.edit'));
				expect(setup.outcome, `setup ${level}`).toBe(expected);
				expect(gearItem.outcome, `gear ${level}`).toBe(expected);
				if (expected === 'ok') {
					expect(setup.result!.setup.id).toBe(w.setupId);
					expect(setup.result!.access.studioId).toBe(w.studioId);
					expect(gearItem.result!.row.id).toBe(w.gearId);
				}
			}
			if (role !== 'none') {
				const mayEdit = role !== 'viewer';
				const { result } = await attempt(() => authorizeSetup(w.actor, w.setupId, 'setups.view'));
				expect(result!.canEdit).toBe(mayEdit);
				expect(result!.canDuplicate).toBe(true);
				expect(result!.studioName).toMatch(/^Fernhill Geology Circle/);
				const g = await attempt(() => authorizeGear(w.actor, w.gearId, 'gear.view'));
				expect(g.result!.canEdit).toBe(mayEdit);
			}
		});
	}

	it('anonymous callers get 401; a malformed or unknown id is the same 404 as a setup out of sight', async () => {
		const w = await worldWithSetupAndGear('none');
		expect((await attempt(() => authorizeSetup(null, w.setupId, 'setups.view'))).outcome).toBe(401);
		expect((await attempt(() => authorizeGear(null, w.gearId, 'gear.view'))).outcome).toBe(401);
		const outOfSight = await attempt(() => authorizeSetup(w.actor, w.setupId, 'setups.view'));
		const unknown = await attempt(() => authorizeSetup(w.founder, randomUUID(), 'setups.view'));
		const malformed = await attempt(() => authorizeSetup(w.founder, "1' or '1'='1", 'setups.view'));
		for (const r of [outOfSight, unknown, malformed]) {
			expect(r.outcome).toBe(404);
			expect((r.error as { body: { message: string } }).body.message).toBe('No such setup.');
		}
		expect((await attempt(() => authorizeGear(w.founder, 'not-a-uuid', 'gear.view'))).outcome).toBe(404);
	});

	it('a setup in the trash is a 404 unless the trash is asked for; a deleted studio hides its setups from everyone', async () => {
		const w = await worldWithSetupAndGear('admin');
		const { trashSetup } = await import('$lib/server/setups');
		await trashSetup(w.founder, w.setupId);
		expect((await attempt(() => authorizeSetup(w.founder, w.setupId, 'setups.view'))).outcome).toBe(404);
		expect((await attempt(() => authorizeSetup(w.founder, w.setupId, 'setups.edit', { includeTrashed: true }))).outcome).toBe('ok');
		await db.update(studios).set({ deletedAt: new Date() }).where(eq(studios.id, w.studioId));
		for (const who of [w.founder, w.actor]) {
			expect((await attempt(() => authorizeSetup(who, w.setupId, 'setups.view', { includeTrashed: true }))).outcome).toBe(404);
		}
	});

	it('requireUser: the caller when signed in; 401 for services, a redirect to sign in and back for pages', async () => {
		const user = await makeUser('mara.quill');
		expect(requireUser(user)).toBe(user);
		expect(requireUser(user, new URL('http://127.0.0.1/setups'))).toBe(user);
		expect((await attempt(async () => requireUser(null))).outcome).toBe(401);
		try {
			requireUser(null, new URL('http://127.0.0.1/setups?q=quartz&page=2'));
			expect.unreachable('an anonymous page visit must be redirected');
		} catch (e) {
			expect(isRedirect(e)).toBe(true);
			expect((e as { status: number; location: string }).status).toBe(303);
			expect((e as { location: string }).location).toBe(`/signin?callbackUrl=${encodeURIComponent('/setups?q=quartz&page=2')}`);
		}
	});
});
