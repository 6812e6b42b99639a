// The setups API through HTTP against the running app (TEST_BASE_URL) and its real database
// (DATABASE_URL): every route for every role, with a session cookie and with a personal access token;
// concurrent saves; restore, duplicate, trash; import; bad input. Nothing is mocked.
import { beforeAll, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { gear, setupRevisions, setups } from '$lib/server/db/schema';
import {
	api,
	baseUrl,
	expectErrorBody,
	makeStudio,
	makeUser,
	ROLES,
	sampleDocument,
	type TestRole,
	type TestStudio,
	type TestUser
} from '$lib/server/testing/notebook-fixtures';
import { createSetup, trashSetup } from '$lib/server/setups';
import { createGear } from '$lib/server/gear';
import { setupCreateSchema } from '$lib/scene/inputs';
import { DEFAULT_MAX_BODY_BYTES } from '$lib/server/http';
import { computeExposure } from '$lib/light/scene';
import { migrateDocument } from '$lib/scene/migrations';
import { CURRENT_SCHEMA_VERSION } from '$lib/scene/version';

/** A 1 × 1 PNG. */
const PNG_BASE64 = 'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==';

let studio: TestStudio;
let gearId: string;

beforeAll(async () => {
	baseUrl(); // fails at once when the app is not running
	studio = await makeStudio('HTTP tests');
	gearId = (
		await createGear(studio.people.owner.user, {
			studioId: studio.studioId,
			kind: 'flash',
			name: 'Kestrel 40 speedlight',
			spec: { guideNumberM: 40, lowestPower: 1 / 256, syncSpeedS: 1 / 250, calibrationOffsetStops: 0, mainsPowered: false },
			notes: ''
		})
	).id;
});

/** A setup in the test studio, made directly through the service (so each case starts fresh). */
async function freshSetup(opts: { title?: string; revisions?: number; trashed?: boolean; thumbnail?: boolean } = {}) {
	const owner = studio.people.owner.user;
	const { id } = await createSetup(
		owner,
		setupCreateSchema.parse({
			studioId: studio.studioId,
			title: opts.title ?? 'Matrix setup',
			subject: 'Quartz',
			tags: ['matrix'],
			document: sampleDocument(),
			...(opts.thumbnail ? { thumbnailPng: PNG_BASE64 } : {})
		})
	);
	for (let n = 2; n <= (opts.revisions ?? 1); n++) {
		const res = await api('PUT', `/api/v1/setups/${id}`, {
			auth: { kind: 'token', who: studio.people.owner },
			body: { baseRevision: n - 1, document: sampleDocument({ notes: `r${n}` }) }
		});
		expect(res.status).toBe(200);
	}
	if (opts.trashed) await trashSetup(owner, id);
	return id;
}

async function revisionCount(id: string) {
	return (await db.select({ n: setupRevisions.number }).from(setupRevisions).where(eq(setupRevisions.setupId, id))).length;
}

async function setupRow(id: string) {
	const [row] = await db.select().from(setups).where(eq(setups.id, id));
	return row;
}

type Need = 'view' | 'edit' | 'duplicate-here';

interface RouteCase {
	name: string;
	need: Need;
	/** Makes what the request acts on, returns method, path and body. */
	prepare: () => Promise<{ method: string; path: string; body?: unknown; id?: string }>;
	okStatus: number;
	/** Checks the effect of an accepted request. */
	accepted?: (ctx: { id?: string; body: any; who: TestUser; role: TestRole }) => Promise<void>;
	/** Checks that a refused request changed nothing. */
	refused?: (ctx: { id?: string }) => Promise<void>;
}

let shared: string;
let sharedWithThumb: string;
const sharedId = async () => (shared ??= await freshSetup({ title: 'Shared read-only', revisions: 2 }));
const thumbId = async () => (sharedWithThumb ??= await freshSetup({ title: 'With thumbnail', thumbnail: true }));

const unchanged = (revisions: number, deleted = false) => async ({ id }: { id?: string }) => {
	expect(await revisionCount(id!)).toBe(revisions);
	expect((await setupRow(id!)).deletedAt !== null).toBe(deleted);
};

const ROUTES: RouteCase[] = [
	{
		name: 'GET /api/v1/setups?studio=',
		need: 'view',
		okStatus: 200,
		prepare: async () => {
			const id = await sharedId();
			return { method: 'GET', path: `/api/v1/setups?studio=${studio.studioId}`, id };
		},
		accepted: async ({ body, id }) => {
			expect(body.items.map((i: { id: string }) => i.id)).toContain(id);
			expect(body).toMatchObject({ page: 1, pageSize: 20 });
		}
	},
	{
		name: 'POST /api/v1/setups',
		need: 'edit',
		okStatus: 201,
		prepare: async () => ({
			method: 'POST',
			path: '/api/v1/setups',
			body: { studioId: studio.studioId, title: 'Made through HTTP', subject: 'Ammonite', document: sampleDocument() }
		}),
		accepted: async ({ body }) => {
			expect(body.revisionNumber).toBe(1);
			expect((await setupRow(body.id)).studioId).toBe(studio.studioId);
		}
	},
	{
		name: 'GET /api/v1/setups/:id',
		need: 'view',
		okStatus: 200,
		prepare: async () => {
			const id = await sharedId();
			return { method: 'GET', path: `/api/v1/setups/${id}`, id };
		},
		accepted: async ({ body, id, role }) => {
			expect(body).toMatchObject({ id, revisionNumber: 2, studioId: studio.studioId, derivedFrom: null, canEdit: role !== 'viewer' });
			expect(body.document.schemaVersion).toBe(CURRENT_SCHEMA_VERSION);
		}
	},
	{
		name: 'PUT /api/v1/setups/:id',
		need: 'edit',
		okStatus: 200,
		prepare: async () => {
			const id = await freshSetup();
			return { method: 'PUT', path: `/api/v1/setups/${id}`, body: { baseRevision: 1, document: sampleDocument({ notes: 'saved' }), message: 'via HTTP' }, id };
		},
		accepted: async ({ body, id, who }) => {
			expect(body).toEqual({ revisionNumber: 2 });
			const [r] = await db.select().from(setupRevisions).where(eq(setupRevisions.setupId, id!)).orderBy(setupRevisions.number).offset(1);
			expect(r).toMatchObject({ number: 2, authorId: who.user.id, message: 'via HTTP' });
		},
		refused: unchanged(1)
	},
	{
		name: 'DELETE /api/v1/setups/:id',
		need: 'edit',
		okStatus: 204,
		prepare: async () => {
			const id = await freshSetup({ revisions: 2 });
			return { method: 'DELETE', path: `/api/v1/setups/${id}`, id };
		},
		accepted: async ({ id }) => {
			expect((await setupRow(id!)).deletedAt).not.toBeNull();
			expect(await revisionCount(id!)).toBe(2);
		},
		refused: unchanged(2)
	},
	{
		name: 'GET /api/v1/setups/:id/revisions',
		need: 'view',
		okStatus: 200,
		prepare: async () => {
			const id = await sharedId();
			return { method: 'GET', path: `/api/v1/setups/${id}/revisions`, id };
		},
		accepted: async ({ body }) => {
			expect(body.map((r: { number: number }) => r.number)).toEqual([2, 1]);
			expect(body[0]).toEqual(expect.objectContaining({ authorName: expect.any(String), createdAt: expect.any(String), message: expect.any(String) }));
		}
	},
	{
		name: 'GET /api/v1/setups/:id/revisions/:n',
		need: 'view',
		okStatus: 200,
		prepare: async () => {
			const id = await sharedId();
			return { method: 'GET', path: `/api/v1/setups/${id}/revisions/1`, id };
		},
		accepted: async ({ body }) => {
			expect(body).toMatchObject({ number: 1, isLatest: false });
			expect(body.document.scene.lights).toHaveLength(2);
		}
	},
	{
		name: 'GET /api/v1/setups/:id/revisions/:n/thumbnail',
		need: 'view',
		okStatus: 200,
		prepare: async () => {
			const id = await thumbId();
			return { method: 'GET', path: `/api/v1/setups/${id}/revisions/1/thumbnail`, id };
		}
	},
	{
		name: 'POST /api/v1/setups/:id/revisions/:n/restore',
		need: 'edit',
		okStatus: 200,
		prepare: async () => {
			const id = await freshSetup({ revisions: 2 });
			return { method: 'POST', path: `/api/v1/setups/${id}/revisions/1/restore`, id };
		},
		accepted: async ({ body, id }) => {
			expect(body).toEqual({ revisionNumber: 3 });
			expect(await revisionCount(id!)).toBe(3);
		},
		refused: unchanged(2)
	},
	{
		name: 'POST /api/v1/setups/:id/duplicate (default studio)',
		need: 'view',
		okStatus: 201,
		prepare: async () => {
			const id = await sharedId();
			return { method: 'POST', path: `/api/v1/setups/${id}/duplicate`, body: { subject: 'Smoky quartz' }, id };
		},
		accepted: async ({ body, id, who, role }) => {
			expect(body).toMatchObject({ revisionNumber: 1, derivedFrom: { setupId: id, revisionNumber: 2 } });
			// Where the caller may edit the origin's studio it stays there; a viewer's copy goes home.
			const row = await setupRow(body.id);
			expect(row.studioId).toBe(role === 'viewer' ? who.personalStudioId : studio.studioId);
			expect(row.derivedFromSetupId).toBe(id);
		}
	},
	{
		name: 'POST /api/v1/setups/:id/duplicate (into this studio)',
		need: 'edit',
		okStatus: 201,
		prepare: async () => {
			const id = await sharedId();
			return { method: 'POST', path: `/api/v1/setups/${id}/duplicate`, body: { subject: 'Rose quartz', studioId: studio.studioId }, id };
		},
		accepted: async ({ body }) => expect((await setupRow(body.id)).studioId).toBe(studio.studioId)
	},
	{
		name: 'GET /api/v1/setups/:id/exposure',
		need: 'view',
		okStatus: 200,
		prepare: async () => {
			const id = await sharedId();
			return { method: 'GET', path: `/api/v1/setups/${id}/exposure`, id };
		},
		accepted: async ({ body }) => {
			expect(body.revisionNumber).toBe(2);
			expect(body.apertureTable.length).toBeGreaterThan(0);
		}
	},
	{
		name: 'GET /api/v1/setups/:id/export',
		need: 'view',
		okStatus: 200,
		prepare: async () => {
			const id = await sharedId();
			return { method: 'GET', path: `/api/v1/setups/${id}/export`, id };
		},
		accepted: async ({ body }) => expect(body).toMatchObject({ formatVersion: 1, kind: 'squarelaw.setup', title: 'Shared read-only' })
	},
	{
		name: 'GET /api/v1/setups/trash?studio=',
		need: 'edit',
		okStatus: 200,
		prepare: async () => {
			const id = await freshSetup({ title: 'In the trash', trashed: true });
			return { method: 'GET', path: `/api/v1/setups/trash?studio=${studio.studioId}`, id };
		},
		accepted: async ({ body, id }) => expect(body.items.map((i: { id: string }) => i.id)).toContain(id)
	},
	{
		name: 'POST /api/v1/setups/:id/untrash',
		need: 'edit',
		okStatus: 200,
		prepare: async () => {
			const id = await freshSetup({ revisions: 2, trashed: true });
			return { method: 'POST', path: `/api/v1/setups/${id}/untrash`, id };
		},
		accepted: async ({ body, id }) => {
			expect(body).toEqual({ id, revisionNumber: 2 });
			expect((await setupRow(id!)).deletedAt).toBeNull();
		},
		refused: unchanged(2, true)
	},
	{
		name: 'POST /api/v1/setups/import?studio=',
		need: 'edit',
		okStatus: 201,
		prepare: async () => {
			const id = await sharedId();
			const file = await api('GET', `/api/v1/setups/${id}/export`, { auth: { kind: 'token', who: studio.people.owner } });
			return { method: 'POST', path: `/api/v1/setups/import?studio=${studio.studioId}`, body: JSON.stringify(file.body) };
		},
		accepted: async ({ body }) => {
			const row = await setupRow(body.id);
			expect(row).toMatchObject({ studioId: studio.studioId, title: 'Shared read-only', derivedFromSetupId: null });
		}
	},
	{
		name: 'GET /api/v1/gear?studio=',
		need: 'view',
		okStatus: 200,
		prepare: async () => ({ method: 'GET', path: `/api/v1/gear?studio=${studio.studioId}` }),
		accepted: async ({ body }) => expect(body.items.map((g: { id: string }) => g.id)).toContain(gearId)
	},
	{
		name: 'POST /api/v1/gear',
		need: 'edit',
		okStatus: 201,
		prepare: async () => ({
			method: 'POST',
			path: '/api/v1/gear',
			body: { studioId: studio.studioId, kind: 'reflector', name: 'White card', spec: { widthM: 0.2, heightM: 0.3, reflectance: 0.85, surface: 'diffuse' } }
		}),
		accepted: async ({ body }) => {
			const [row] = await db.select().from(gear).where(eq(gear.id, body.id));
			expect(row).toMatchObject({ studioId: studio.studioId, kind: 'reflector' });
		}
	},
	{
		name: 'GET /api/v1/gear/:id',
		need: 'view',
		okStatus: 200,
		prepare: async () => ({ method: 'GET', path: `/api/v1/gear/${gearId}` }),
		accepted: async ({ body }) => expect(body).toMatchObject({ id: gearId, kind: 'flash' })
	},
	{
		name: 'PATCH /api/v1/gear/:id',
		need: 'edit',
		okStatus: 200,
		prepare: async () => ({ method: 'PATCH', path: `/api/v1/gear/${gearId}`, body: { notes: `checked ${Date.now()}` } }),
		accepted: async ({ body }) => expect(body.notes).toMatch(/^checked/)
	}
];

/** What authz answers for a role: anonymous 401, outsiders 404 (never revealing), viewers 403 for edits. */
function expectedStatus(route: RouteCase, role: TestRole | 'anonymous') {
	if (role === 'anonymous') return 401;
	if (role === 'none') return 404;
	if (role === 'viewer' && route.need === 'edit') return 403;
	return route.okStatus;
}

describe('every route refuses what authz refuses, for every role', () => {
	for (const route of ROUTES) {
		describe(route.name, () => {
			it('anonymous: 401', async () => {
				const req = await route.prepare();
				const res = await api(req.method, req.path, { auth: { kind: 'anonymous' }, body: req.body });
				expectErrorBody(res, 401);
				if (route.refused) await route.refused({ id: req.id });
			});
			for (const role of ROLES) {
				for (const kind of ['cookie', 'token'] as const) {
					const status = expectedStatus(route, role);
					it(`${role} with a ${kind === 'cookie' ? 'session cookie' : 'personal access token'}: ${status}`, async () => {
						const who = studio.people[role];
						const req = await route.prepare();
						const res = await api(req.method, req.path, { auth: { kind, who }, body: req.body });
						if (status >= 400) {
							expectErrorBody(res, status);
							if (route.refused) await route.refused({ id: req.id });
						} else {
							expect(res.status, JSON.stringify(res.body)).toBe(status);
							if (route.accepted) await route.accepted({ id: req.id, body: res.body, who, role });
						}
					});
				}
			}
		});
	}

	it('a revoked token or an expired session is anonymous', async () => {
		const u = await makeUser('revoked');
		const id = await sharedId();
		await db.execute(sql`update access_tokens set revoked_at = now() where user_id = ${u.user.id}`);
		expectErrorBody(await api('GET', `/api/v1/setups/${id}`, { auth: { kind: 'token', who: u } }), 401);
		await db.execute(sql`update sessions set expires = now() - interval '1 minute' where user_id = ${u.user.id}`);
		expectErrorBody(await api('GET', `/api/v1/setups/${id}`, { auth: { kind: 'cookie', who: u } }), 401);
		expectErrorBody(await api('GET', '/api/v1/setups', { auth: { kind: 'anonymous' }, headers: { authorization: 'Bearer slw_not-a-token' } }), 401);
	});

	it('an outsider gets the same 404 for a setup that exists and one that does not', async () => {
		const id = await sharedId();
		const outsider = studio.people.none;
		const real = await api('GET', `/api/v1/setups/${id}`, { auth: { kind: 'token', who: outsider } });
		const missing = await api('GET', '/api/v1/setups/00000000-0000-4000-8000-000000000000', { auth: { kind: 'token', who: outsider } });
		const notUuid = await api('GET', '/api/v1/setups/not-a-uuid', { auth: { kind: 'token', who: outsider } });
		expect(real.body).toEqual(missing.body);
		expect(notUuid.body).toEqual(missing.body);
		expectErrorBody(real, 404);
		const list = await api('GET', '/api/v1/setups?q=shared%20read-only', { auth: { kind: 'token', who: outsider } });
		expect(list.body.total).toBe(0);
	});
});

describe('saving through HTTP', () => {
	it('twenty concurrent PUTs on one base: one 200, nineteen 409 with latestRevision, no revision lost or numbered twice', async () => {
		const id = await freshSetup({ title: 'HTTP race' });
		const editor = studio.people.editor;
		const answers = await Promise.all(
			Array.from({ length: 20 }, (_, i) =>
				api('PUT', `/api/v1/setups/${id}`, {
					auth: { kind: i % 2 ? 'cookie' : 'token', who: editor },
					body: { baseRevision: 1, document: sampleDocument({ notes: `racer ${i}` }), message: `racer ${i}` }
				})
			)
		);
		const ok = answers.filter((a) => a.status === 200);
		const conflicts = answers.filter((a) => a.status === 409);
		expect(ok).toHaveLength(1);
		expect(conflicts).toHaveLength(19);
		expect(ok[0].body).toEqual({ revisionNumber: 2 });
		for (const c of conflicts) {
			expectErrorBody(c, 409);
			expect(c.body.latestRevision).toBe(2);
		}
		const revisions = await api('GET', `/api/v1/setups/${id}/revisions`, { auth: { kind: 'token', who: editor } });
		expect(revisions.body.map((r: { number: number }) => r.number)).toEqual([2, 1]);
		const winner = await api('GET', `/api/v1/setups/${id}/revisions/2`, { auth: { kind: 'token', who: editor } });
		expect(winner.body.document.notes).toBe(winner.body.message);
	});

	it('a save with a new title, tags and thumbnail shows in the list; the thumbnail is served as PNG', async () => {
		const id = await freshSetup({ title: 'Before' });
		const editor = studio.people.editor;
		const res = await api('PUT', `/api/v1/setups/${id}`, {
			auth: { kind: 'token', who: editor },
			body: { baseRevision: 1, document: sampleDocument(), title: 'After', tags: ['Velvet', 'velvet ', 'catalogue'], thumbnailPng: `data:image/png;base64,${PNG_BASE64}` }
		});
		expect(res.status).toBe(200);
		const list = await api('GET', `/api/v1/setups?studio=${studio.studioId}&q=after&tag=velvet`, { auth: { kind: 'token', who: editor } });
		expect(list.body.items).toEqual([expect.objectContaining({ id, title: 'After', tags: ['velvet', 'catalogue'], revisionNumber: 2, thumbnailRevision: 2 })]);
		const thumb = await fetch(`${baseUrl()}/api/v1/setups/${id}/revisions/2/thumbnail`, { headers: { authorization: `Bearer ${editor.token}` } });
		expect(thumb.headers.get('content-type')).toBe('image/png');
		expect(Buffer.from(await thumb.arrayBuffer()).toString('base64')).toBe(PNG_BASE64);
		const none = await api('GET', `/api/v1/setups/${id}/revisions/1/thumbnail`, { auth: { kind: 'token', who: editor } });
		expectErrorBody(none, 404);
	});
});

describe('restore, duplicate, trash through HTTP', () => {
	it('restore makes a new revision that copies the old one', async () => {
		const id = await freshSetup({ revisions: 3 });
		const auth = { kind: 'cookie' as const, who: studio.people.editor };
		const res = await api('POST', `/api/v1/setups/${id}/revisions/1/restore`, { auth, body: { message: 'Back to the first layout' } });
		expect(res.body).toEqual({ revisionNumber: 4 });
		const r1 = await api('GET', `/api/v1/setups/${id}/revisions/1`, { auth });
		const r4 = await api('GET', `/api/v1/setups/${id}/revisions/4`, { auth });
		expect(r4.body.document).toEqual(r1.body.document);
		expect(r4.body).toMatchObject({ restoredFrom: 1, message: 'Back to the first layout' });
		const list = await api('GET', `/api/v1/setups/${id}/revisions`, { auth });
		expect(list.body.map((r: { number: number }) => r.number)).toEqual([4, 3, 2, 1]);
	});

	it('a duplicate records its origin and the origin lists it', async () => {
		const origin = await freshSetup({ title: 'Origin', revisions: 2 });
		const auth = { kind: 'token' as const, who: studio.people.editor };
		const dup = await api('POST', `/api/v1/setups/${origin}/duplicate`, { auth, body: { subject: 'Citrine point', title: 'Citrine on velvet' } });
		expect(dup.status).toBe(201);
		expect(dup.body).toMatchObject({ revisionNumber: 1, derivedFrom: { setupId: origin, revisionNumber: 2 } });
		const copy = await api('GET', `/api/v1/setups/${dup.body.id}`, { auth });
		expect(copy.body).toMatchObject({ title: 'Citrine on velvet', subject: 'Citrine point', derivedFrom: { setupId: origin, revisionNumber: 2 } });
		const originBody = await api('GET', `/api/v1/setups/${origin}`, { auth });
		expect(originBody.body.derivatives).toEqual([expect.objectContaining({ id: dup.body.id, title: 'Citrine on velvet' })]);
		const listed = await api('GET', `/api/v1/setups?studio=${studio.studioId}&q=citrine`, { auth });
		expect(listed.body.items[0].derivedFrom).toEqual({ setupId: origin, revisionNumber: 2 });
	});

	it('delete and restore from the trash keep every revision', async () => {
		const id = await freshSetup({ revisions: 4 });
		const auth = { kind: 'token' as const, who: studio.people.editor };
		const before = await api('GET', `/api/v1/setups/${id}/revisions`, { auth });
		expect((await api('DELETE', `/api/v1/setups/${id}`, { auth })).status).toBe(204);
		expectErrorBody(await api('GET', `/api/v1/setups/${id}`, { auth }), 404);
		expectErrorBody(await api('DELETE', `/api/v1/setups/${id}`, { auth }), 404);
		const trash = await api('GET', `/api/v1/setups/trash?studio=${studio.studioId}`, { auth });
		expect(trash.body.items.find((i: { id: string }) => i.id === id)).toMatchObject({ revisionNumber: 4, deletedAt: expect.any(String) });
		expect((await api('POST', `/api/v1/setups/${id}/untrash`, { auth })).body).toEqual({ id, revisionNumber: 4 });
		const after = await api('GET', `/api/v1/setups/${id}/revisions`, { auth });
		expect(after.body).toEqual(before.body);
	});

	it('the exposure is computed on the server from the stored document', async () => {
		const id = await freshSetup({ revisions: 2 });
		const auth = { kind: 'token' as const, who: studio.people.viewer };
		const r1 = await api('GET', `/api/v1/setups/${id}/revisions/1`, { auth });
		const expected = computeExposure((migrateDocument(r1.body.document) as { ok: true; document: any }).document.scene);
		const res = await api('GET', `/api/v1/setups/${id}/exposure?revision=1`, { auth });
		expect(res.status).toBe(200);
		expect(res.body.total).toEqual(expected.total);
		expect(res.body.apertureTable).toEqual(expected.apertureTable);
		expect(res.body.lights.map((l: { id: string }) => l.id)).toEqual(['key', 'card']);
	});

	it('the seeded demo setups are there, with lineage, revisions by two people and the club gear shelf', async () => {
		const quartz = '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000001';
		const admin = { kind: 'token' as const, who: studio.people.admin };
		const detail = await api('GET', `/api/v1/setups/${quartz}`, { auth: admin });
		expect(detail.body).toMatchObject({ title: 'Quartz cluster on black velvet', revisionNumber: 5 });
		expect(detail.body.derivatives.map((d: { title: string }) => d.title)).toContain('Amethyst geode on black velvet');
		const revs = await api('GET', `/api/v1/setups/${quartz}/revisions`, { auth: admin });
		expect(new Set(revs.body.map((r: { authorName: string }) => r.authorName))).toEqual(new Set(['Mara Quill', 'Tobias Wren']));
		const shelf = await api('GET', `/api/v1/gear?studio=${detail.body.studioId}&retired=1`, { auth: admin });
		expect(shelf.body.items.map((g: { name: string }) => g.name)).toContain('Kestrel 40 speedlight');
		expect(shelf.body.items.some((g: { retiredAt: string | null }) => g.retiredAt !== null)).toBe(true);
	});
});

describe('import through HTTP', () => {
	const auth = () => ({ kind: 'token' as const, who: studio.people.editor });
	const countInStudio = async () => (await db.select({ id: setups.id }).from(setups).where(eq(setups.studioId, studio.studioId))).length;

	it('malformed, truncated, oversized or foreign files are refused, named, and create nothing', async () => {
		const id = await sharedId();
		const good = JSON.stringify((await api('GET', `/api/v1/setups/${id}/export`, { auth: auth() })).body);
		const before = await countInStudio();
		const cases: [string, number, RegExp][] = [
			[good.slice(0, Math.floor(good.length / 2)), 400, /truncated/],
			['{"formatVersion": 1, kind: squarelaw}', 400, /not valid JSON/],
			[JSON.stringify({ type: 'FeatureCollection', features: [] }), 400, /not a Squarelaw setup file/],
			[JSON.stringify({ ...JSON.parse(good), formatVersion: 3 }), 400, /newer version/],
			[JSON.stringify({ ...JSON.parse(good), title: 7 }), 400, /title/],
			['', 400, /empty/],
			[good.replace(/"iso":\s*100/, '"iso": -100'), 400, /document\.scene\.camera\.iso/],
			[JSON.stringify({ ...JSON.parse(good), padding: 'x'.repeat(1024 * 1024) }), 413, /too large/]
		];
		for (const [body, status, message] of cases) {
			const res = await api('POST', `/api/v1/setups/import?studio=${studio.studioId}`, { auth: auth(), body });
			expectErrorBody(res, status);
			expect(res.body.error.message, body.slice(0, 60)).toMatch(message);
		}
		expect(await countInStudio()).toBe(before);
	});

	it('a file sent as a form upload imports', async () => {
		const id = await sharedId();
		const good = JSON.stringify((await api('GET', `/api/v1/setups/${id}/export`, { auth: auth() })).body);
		const form = new FormData();
		form.set('file', new Blob([good], { type: 'application/json' }), 'shared.squarelaw.json');
		const res = await fetch(`${baseUrl()}/api/v1/setups/import?studio=${studio.studioId}`, {
			method: 'POST',
			headers: { authorization: `Bearer ${studio.people.editor.token}`, origin: baseUrl() },
			body: form
		});
		expect(res.status).toBe(201);
		const { id: newId } = await res.json();
		const copy = await api('GET', `/api/v1/setups/${newId}`, { auth: auth() });
		const original = await api('GET', `/api/v1/setups/${id}`, { auth: auth() });
		expect(copy.body.document).toEqual(original.body.document);
	});
});

describe('bad input is a 400 naming the field, never a 500', () => {
	const auth = () => ({ kind: 'token' as const, who: studio.people.owner });

	it('on every route', async () => {
		const id = await freshSetup({ revisions: 2 });
		const doc = sampleDocument();
		const cases: [string, string, unknown, string][] = [
			['GET', '/api/v1/setups?pageSize=abc', undefined, 'pageSize'],
			['GET', '/api/v1/setups?pageSize=1000', undefined, 'pageSize'],
			['GET', '/api/v1/setups?page=0', undefined, 'page'],
			['GET', '/api/v1/setups?studio=nope', undefined, 'studio'],
			['GET', '/api/v1/setups?sort=colour', undefined, 'sort'],
			['GET', '/api/v1/setups?gear=kestrel', undefined, 'gear'],
			['GET', '/api/v1/setups/trash?order=sideways', undefined, 'order'],
			['POST', '/api/v1/setups', { subject: 's', document: doc }, 'title'],
			['POST', '/api/v1/setups', { title: 't', document: doc }, 'subject'],
			['POST', '/api/v1/setups', { title: 't', subject: 's' }, 'document'],
			['POST', '/api/v1/setups', { title: 't', subject: 's', tags: 'a,b', document: doc }, 'tags'],
			['POST', '/api/v1/setups', { title: 't', subject: 's', studioId: 42, document: doc }, 'studioId'],
			['POST', '/api/v1/setups', { title: 't', subject: 's', document: { ...doc, schemaVersion: 99 } }, 'document.schemaVersion'],
			['POST', '/api/v1/setups', { title: 't', subject: 's', document: { ...doc, scene: { ...doc.scene, camera: { ...doc.scene.camera, aperture: 0 } } } }, 'document.scene.camera.aperture'],
			['POST', '/api/v1/setups', { title: 't', subject: 's', document: { ...doc, plan: { elements: { key: { colour: 'blue' } } } } }, 'document.plan.elements.key.colour'],
			['POST', '/api/v1/setups', { title: 't', subject: 's', document: { ...doc, plan: { elements: { key: { gearId: '00000000-0000-4000-8000-000000000000' } } } } }, 'document.plan.elements.key.gearId'],
			['POST', '/api/v1/setups', { title: 't', subject: 's', document: doc, thumbnailPng: 'bm90IGEgcG5n' }, 'thumbnailPng'],
			['PUT', `/api/v1/setups/${id}`, { document: doc }, 'baseRevision'],
			['PUT', `/api/v1/setups/${id}`, { baseRevision: 'two', document: doc }, 'baseRevision'],
			['PUT', `/api/v1/setups/${id}`, { baseRevision: 2.5, document: doc }, 'baseRevision'],
			['PUT', `/api/v1/setups/${id}`, { baseRevision: 2, document: { ...doc, notes: 5 } }, 'document.notes'],
			['PUT', `/api/v1/setups/${id}`, { baseRevision: 2, document: doc, message: 'm'.repeat(501) }, 'message'],
			['PUT', `/api/v1/setups/${id}`, { baseRevision: 2, document: doc, refreshGear: ['x'] }, 'refreshGear.0'],
			['GET', `/api/v1/setups/${id}/revisions/first`, undefined, 'n'],
			['GET', `/api/v1/setups/${id}/revisions/0`, undefined, 'n'],
			['GET', `/api/v1/setups/${id}/revisions/-1/thumbnail`, undefined, 'n'],
			['POST', `/api/v1/setups/${id}/revisions/x/restore`, undefined, 'n'],
			['POST', `/api/v1/setups/${id}/revisions/1/restore`, { baseRevision: 'latest' }, 'baseRevision'],
			['POST', `/api/v1/setups/${id}/duplicate`, {}, 'subject'],
			['POST', `/api/v1/setups/${id}/duplicate`, { subject: '  ' }, 'subject'],
			['POST', `/api/v1/setups/${id}/duplicate`, { subject: 's', studioId: 'home' }, 'studioId'],
			['POST', `/api/v1/setups/${id}/duplicate`, { subject: 's', revisionNumber: 0 }, 'revisionNumber'],
			['GET', `/api/v1/setups/${id}/exposure?revision=latest`, undefined, 'revision'],
			['GET', `/api/v1/setups/${id}/export?revision=1.5`, undefined, 'revision'],
			['POST', '/api/v1/setups/import?studio=mine', '{}', 'studio'],
			['GET', '/api/v1/gear?kind=tripod', undefined, 'kind'],
			['GET', '/api/v1/gear?studio=x', undefined, 'studio'],
			['POST', '/api/v1/gear', { kind: 'tripod', name: 'x', spec: {} }, 'kind'],
			['POST', '/api/v1/gear', { kind: 'flash', name: '', spec: { guideNumberM: 40, lowestPower: 0.01, syncSpeedS: 0.005 } }, 'name'],
			['POST', '/api/v1/gear', { kind: 'flash', name: 'x', spec: { guideNumberM: -40, lowestPower: 0.01, syncSpeedS: 0.005 } }, 'spec.guideNumberM'],
			['PATCH', `/api/v1/gear/${gearId}`, { spec: { guideNumberM: 40, lowestPower: 3, syncSpeedS: 0.005 } }, 'spec.lowestPower'],
			['PATCH', `/api/v1/gear/${gearId}`, { retired: 'yes' }, 'retired']
		];
		for (const [method, path, body, field] of cases) {
			const res = await api(method, path, { auth: auth(), body });
			expect(res.status, `${method} ${path} ${JSON.stringify(body)?.slice(0, 80)}: ${JSON.stringify(res.body)}`).toBe(400);
			expectErrorBody(res, 400, field);
			expect(res.body.error.message).toContain(field);
		}
		// None of that saved anything.
		expect(await revisionCount(id)).toBe(2);
	});

	it('junk bodies on every write route', async () => {
		const id = await freshSetup({ revisions: 2 });
		// A restore's body is optional and unknown keys are dropped, so some junk restores: use another setup.
		const restoreId = await freshSetup({ revisions: 2 });
		const writes: [string, string][] = [
			['POST', '/api/v1/setups'],
			['PUT', `/api/v1/setups/${id}`],
			['POST', `/api/v1/setups/${id}/duplicate`],
			['POST', `/api/v1/setups/${restoreId}/revisions/1/restore`],
			['POST', '/api/v1/gear'],
			['PATCH', `/api/v1/gear/${gearId}`]
		];
		const junk = ['{', 'null', '[]', '"text"', '42', '{"document": null, "baseRevision": null}', '{"title": {"$gt": ""}}', '{"power": 1e999}', `${'['.repeat(5000)}${']'.repeat(5000)}`];
		for (const [method, path] of writes) {
			for (const body of junk) {
				const res = await api(method, path, { auth: auth(), body });
				expect(res.status, `${method} ${path} ${body.slice(0, 40)}`).toBeLessThan(500);
				if (res.status >= 400) expectErrorBody(res, res.status);
			}
		}
		expect(await revisionCount(id)).toBe(2);
	});

	it('non-finite numbers in JSON (1e999) are refused, naming the field', async () => {
		const text = JSON.stringify({ title: 't', subject: 's', document: sampleDocument() }).replace('"guideNumber":40', '"guideNumber":1e999');
		expect(text).toContain('1e999');
		const res = await api('POST', '/api/v1/setups', { auth: auth(), body: text });
		expectErrorBody(res, 400, 'document.scene.lights.0.guideNumber');
	});

	it('an oversized body is refused with 413', async () => {
		const res = await api('POST', '/api/v1/setups', {
			auth: auth(),
			body: { title: 't', subject: 's', document: { ...sampleDocument(), notes: 'n'.repeat(DEFAULT_MAX_BODY_BYTES) } }
		});
		expectErrorBody(res, 413);
	});
});
