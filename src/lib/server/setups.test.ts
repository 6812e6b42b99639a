// The notebook's service layer against the real PostgreSQL of `npm test` (DATABASE_URL): concurrency,
// restore, lineage, trash, gear copies and migration on read (export and import: setups-export.test.ts).
// Nothing is mocked.
import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq, sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { gear, setupRevisions, setups, studioSetupCounts } from '$lib/server/db/schema';
import { makeStudio, sampleDocument, type TestStudio } from '$lib/server/testing/notebook-fixtures';
import { createGear, updateGear } from '$lib/server/gear';
import {
	createSetup,
	duplicateSetup,
	getSetup,
	getSetupRevision,
	InputError,
	listSetupRevisions,
	listSetupsFor,
	listTrash,
	restoreRevision,
	saveSetup,
	setupExposure,
	StaleRevisionError,
	trashSetup,
	untrashSetup
} from '$lib/server/setups';
import { setupCreateSchema, setupListQuerySchema, setupSaveSchema } from '$lib/scene/inputs';
import type { SessionUser } from '$lib/server/session';
import { CURRENT_SCHEMA_VERSION } from '$lib/scene/version';

let studio: TestStudio;
let editor: SessionUser;
let viewer: SessionUser;

const create = (user: SessionUser, raw: Record<string, unknown>) => createSetup(user, setupCreateSchema.parse(raw));
const save = (user: SessionUser, id: string, raw: Record<string, unknown>) => saveSetup(user, id, setupSaveSchema.parse(raw));
const list = (user: SessionUser, raw: Record<string, string>) => listSetupsFor(user, setupListQuerySchema.parse(raw));

async function revisionNumbers(setupId: string) {
	const rows = await db
		.select({ n: setupRevisions.number })
		.from(setupRevisions)
		.where(eq(setupRevisions.setupId, setupId))
		.orderBy(setupRevisions.number);
	return rows.map((r) => r.n);
}

beforeAll(async () => {
	studio = await makeStudio('Service tests');
	editor = studio.people.editor.user;
	viewer = studio.people.viewer.user;
});

describe('saving', () => {
	it('twenty concurrent saves on one base: exactly one succeeds, nineteen are stale, nothing is lost or numbered twice', async () => {
		const { id } = await create(editor, { studioId: studio.studioId, title: 'Race', subject: 'Quartz', document: sampleDocument() });
		const outcomes = await Promise.allSettled(
			Array.from({ length: 20 }, (_, i) => save(editor, id, { baseRevision: 1, document: sampleDocument({ notes: `save ${i}` }), message: `save ${i}` }))
		);
		const won = outcomes.filter((o) => o.status === 'fulfilled');
		const lost = outcomes.filter((o): o is PromiseRejectedResult => o.status === 'rejected');
		expect(won).toHaveLength(1);
		expect(lost).toHaveLength(19);
		for (const o of lost) {
			expect(o.reason).toBeInstanceOf(StaleRevisionError);
			expect((o.reason as StaleRevisionError).status).toBe(409);
			expect((o.reason as StaleRevisionError).latestRevision).toBe(2);
		}
		expect(await revisionNumbers(id)).toEqual([1, 2]);
		const winner = (won[0] as PromiseFulfilledResult<{ revisionNumber: number }>).value;
		expect(winner.revisionNumber).toBe(2);
		const r2 = await getSetupRevision(editor, id, 2);
		const [row] = await db.select().from(setups).where(eq(setups.id, id));
		expect(row.latestRevision).toBe(2);
		expect(r2.message).toMatch(/^save \d+$/);
		expect(r2.document.notes).toBe(r2.message);
	});

	it('twenty writers that retry on 409 all land: revisions 1…21, each once, each note kept', async () => {
		const { id } = await create(editor, { studioId: studio.studioId, title: 'Retry race', subject: 'Quartz', document: sampleDocument() });
		async function writer(i: number) {
			for (let attempt = 0; attempt < 100; attempt++) {
				const [row] = await db.select({ latest: setups.latestRevision }).from(setups).where(eq(setups.id, id));
				const latest = row.latest;
				try {
					return await save(editor, id, { baseRevision: latest, document: sampleDocument({ notes: `writer ${i}` }), message: `writer ${i}` });
				} catch (e) {
					if (!(e instanceof StaleRevisionError)) throw e;
				}
			}
			throw new Error(`writer ${i} never got through`);
		}
		const results = await Promise.all(Array.from({ length: 20 }, (_, i) => writer(i)));
		expect(results.map((r) => r.revisionNumber).sort((a, b) => a - b)).toEqual(Array.from({ length: 20 }, (_, i) => i + 2));
		expect(await revisionNumbers(id)).toEqual(Array.from({ length: 21 }, (_, i) => i + 1));
		const messages = (await listSetupRevisions(editor, id)).map((r) => r.message);
		for (let i = 0; i < 20; i++) expect(messages).toContain(`writer ${i}`);
		// Every revision's parent is the one before it: a straight line, no forks.
		const parents = await db
			.select({ n: setupRevisions.number, p: setupRevisions.parentNumber })
			.from(setupRevisions)
			.where(eq(setupRevisions.setupId, id));
		for (const r of parents) expect(r.p).toBe(r.n === 1 ? null : r.n - 1);
	});

	it('a stale save leaves the setup as it was', async () => {
		const { id } = await create(editor, { studioId: studio.studioId, title: 'Stale', subject: 'Quartz', document: sampleDocument({ notes: 'one' }) });
		await save(editor, id, { baseRevision: 1, document: sampleDocument({ notes: 'two' }), title: 'Stale, renamed' });
		await expect(save(editor, id, { baseRevision: 1, document: sampleDocument({ notes: 'three' }), title: 'Lost title' })).rejects.toBeInstanceOf(
			StaleRevisionError
		);
		const now = await getSetup(editor, id);
		expect(now).toMatchObject({ revisionNumber: 2, title: 'Stale, renamed' });
		expect(now.document.notes).toBe('two');
		await expect(save(editor, id, { baseRevision: 7, document: sampleDocument() })).rejects.toMatchObject({ status: 409, latestRevision: 2 });
	});

	it('a stale save carries what changed since its base, for the 409 body (nothing to fetch again)', async () => {
		const { id } = await create(editor, { studioId: studio.studioId, title: 'Told', subject: 'Quartz', document: sampleDocument({ notes: 'card left', power: 0.25 }) });
		await save(editor, id, { baseRevision: 1, document: sampleDocument({ notes: 'card right', power: 0.5 }), title: 'Told, renamed', tags: ['velvet'], message: 'Moved the card' });
		const refused = await save(editor, id, { baseRevision: 1, document: sampleDocument({ notes: 'mine' }) }).catch((e: unknown) => e);
		expect(refused).toBeInstanceOf(StaleRevisionError);
		const { extra } = refused as InstanceType<typeof StaleRevisionError>;
		expect(extra.latestRevision).toBe(2);
		expect(extra.conflict).toMatchObject({
			baseRevision: 1,
			latestRevision: 2,
			latestNotes: 'card right',
			latestTitle: 'Told, renamed',
			latestTags: ['velvet'],
			revisions: [expect.objectContaining({ number: 2, message: 'Moved the card' })]
		});
		// The key's power went from 1/4 to 1/2: the comparison says so in words.
		expect(extra.conflict!.changes.join(' ')).toMatch(/power/i);
		expect(extra.conflict!.notesSinceBase).toEqual(expect.arrayContaining([{ op: 'added', line: 'card right' }]));
	});
});

describe('restore', () => {
	it('makes a new revision that copies the old one and keeps the history', async () => {
		const { id } = await create(editor, { studioId: studio.studioId, title: 'Restore me', subject: 'Ammonite', document: sampleDocument({ notes: 'first', power: 0.125 }) });
		await save(editor, id, { baseRevision: 1, document: sampleDocument({ notes: 'second', power: 0.5 }), message: 'brighter' });
		const restored = await restoreRevision(editor, id, 1);
		expect(restored).toEqual({ revisionNumber: 3 });
		const r3 = await getSetupRevision(editor, id, 3);
		const r1 = await getSetupRevision(editor, id, 1);
		expect(r3.document).toEqual(r1.document);
		expect(r3).toMatchObject({ restoredFrom: 1, parentNumber: 2, message: 'Restored revision 1', isLatest: true });
		expect(await revisionNumbers(id)).toEqual([1, 2, 3]);
		expect((await getSetupRevision(editor, id, 2)).document.notes).toBe('second');
		const exposure = await setupExposure(editor, id);
		const exposure1 = await setupExposure(editor, id, 1);
		expect(exposure.revisionNumber).toBe(3);
		expect(exposure.total).toEqual(exposure1.total);
	});

	it('with a stale baseRevision is refused', async () => {
		const { id } = await create(editor, { studioId: studio.studioId, title: 'Restore stale', subject: 'x', document: sampleDocument() });
		await save(editor, id, { baseRevision: 1, document: sampleDocument({ notes: 'b' }) });
		await expect(restoreRevision(editor, id, 1, { baseRevision: 1 })).rejects.toMatchObject({ status: 409, latestRevision: 2 });
		await expect(restoreRevision(editor, id, 9)).rejects.toMatchObject({ status: 404 });
		expect(await revisionNumbers(id)).toEqual([1, 2]);
	});
});

describe('duplicate', () => {
	it('records its origin, and the origin lists it', async () => {
		const origin = await create(editor, { studioId: studio.studioId, title: 'Quartz on velvet', subject: 'Quartz', tags: ['Minerals'], document: sampleDocument({ notes: 'origin r1' }) });
		await save(editor, origin.id, { baseRevision: 1, document: sampleDocument({ notes: 'origin r2' }) });
		const copy = await duplicateSetup(editor, origin.id, { subject: 'Amethyst geode', revisionNumber: 1 });
		expect(copy).toMatchObject({ revisionNumber: 1, derivedFrom: { setupId: origin.id, revisionNumber: 1 }, studioId: studio.studioId });
		const detail = await getSetup(editor, copy.id);
		expect(detail).toMatchObject({ subject: 'Amethyst geode', title: 'Quartz on velvet', tags: ['minerals'], derivedFrom: { setupId: origin.id, revisionNumber: 1, title: 'Quartz on velvet' } });
		expect(detail.document.notes).toBe('origin r1');
		const originDetail = await getSetup(editor, origin.id);
		expect(originDetail.derivatives).toEqual([expect.objectContaining({ id: copy.id, title: 'Quartz on velvet', subject: 'Amethyst geode', revisionNumber: 1 })]);
		const listed = await list(editor, { studio: studio.studioId, q: 'amethyst' });
		expect(listed.items.find((i) => i.id === copy.id)?.derivedFrom).toEqual({ setupId: origin.id, revisionNumber: 1 });
	});

	it('by a viewer goes to their personal studio; into a studio where they only view, it is refused', async () => {
		const origin = await create(editor, { studioId: studio.studioId, title: 'For the viewer', subject: 'Moss', document: sampleDocument() });
		const copy = await duplicateSetup(viewer, origin.id, { subject: 'My moss' });
		expect(copy.studioId).toBe(studio.people.viewer.personalStudioId);
		await expect(duplicateSetup(viewer, origin.id, { subject: 'x', studioId: studio.studioId })).rejects.toMatchObject({ status: 403 });
		// The origin's members do not see a derivative in the viewer's personal studio.
		expect((await getSetup(editor, origin.id)).derivatives.map((d) => d.id)).not.toContain(copy.id);
		expect((await getSetup(viewer, origin.id)).derivatives.map((d) => d.id)).toContain(copy.id);
	});
});

describe('trash', () => {
	it('delete and restore from the trash keep every revision', async () => {
		const { id } = await create(editor, { studioId: studio.studioId, title: 'Into the trash', subject: 'Fossil', document: sampleDocument({ notes: 'a' }) });
		await save(editor, id, { baseRevision: 1, document: sampleDocument({ notes: 'b' }) });
		await save(editor, id, { baseRevision: 2, document: sampleDocument({ notes: 'c' }) });
		const before = await db.select().from(setupRevisions).where(eq(setupRevisions.setupId, id)).orderBy(setupRevisions.number);
		await trashSetup(editor, id);
		await expect(getSetup(editor, id)).rejects.toMatchObject({ status: 404 });
		await expect(save(editor, id, { baseRevision: 3, document: sampleDocument() })).rejects.toMatchObject({ status: 404 });
		expect((await list(editor, { studio: studio.studioId })).items.map((i) => i.id)).not.toContain(id);
		const trash = await listTrash(editor, setupListQuerySchema.parse({ studio: studio.studioId }));
		const inTrash = trash.items.find((i) => i.id === id);
		expect(inTrash).toMatchObject({ revisionNumber: 3, deletedByName: editor.name });
		await expect(listTrash(viewer, setupListQuerySchema.parse({ studio: studio.studioId }))).rejects.toMatchObject({ status: 403 });
		await expect(untrashSetup(viewer, id)).rejects.toMatchObject({ status: 403 });
		expect(await untrashSetup(editor, id)).toEqual({ id, revisionNumber: 3 });
		const after = await db.select().from(setupRevisions).where(eq(setupRevisions.setupId, id)).orderBy(setupRevisions.number);
		expect(after).toEqual(before);
		expect((await getSetup(editor, id)).document.notes).toBe('c');
		await expect(untrashSetup(editor, id)).rejects.toMatchObject({ status: 400 });
	});
});

describe('gear copies', () => {
	it('a later change on the gear shelf never rewrites a saved revision', async () => {
		const flash = await createGear(editor, {
			studioId: studio.studioId,
			kind: 'flash',
			name: 'Kestrel 40 speedlight',
			spec: { guideNumberM: 40, lowestPower: 1 / 256, syncSpeedS: 1 / 250, calibrationOffsetStops: 0, mainsPowered: false },
			notes: ''
		});
		const plan = { elements: { key: { kind: 'flash' as const, label: 'Key', gearId: flash.id } } };
		const { id } = await create(editor, { studioId: studio.studioId, title: 'With gear', subject: 'Quartz', document: sampleDocument({ plan }) });
		const r1 = await getSetupRevision(editor, id, 1);
		expect(r1.document.gear).toEqual([expect.objectContaining({ id: flash.id, name: 'Kestrel 40 speedlight', spec: expect.objectContaining({ guideNumberM: 40 }) })]);

		await updateGear(editor, flash.id, { name: 'Kestrel 40 (recalibrated)', spec: { guideNumberM: 36, lowestPower: 1 / 256, syncSpeedS: 1 / 250, calibrationOffsetStops: -0.3 } });
		expect((await getSetupRevision(editor, id, 1)).document.gear[0]).toEqual(r1.document.gear[0]);

		// A save that keeps the flash carries its copy forward; the client cannot swap it. Only the
		// calibration in force follows the shelf (saves from then on predict with it).
		const forged = { ...sampleDocument({ plan }), gear: [{ ...r1.document.gear[0], spec: { guideNumberM: 999, lowestPower: 0.5, syncSpeedS: 0.004 } }] };
		await save(editor, id, { baseRevision: 1, document: forged });
		const r2 = await getSetupRevision(editor, id, 2);
		expect(r2.document.gear[0]).toEqual({ ...r1.document.gear[0], spec: { ...r1.document.gear[0].spec, calibrationOffsetStops: -0.3 } });
		expect(r2.document.scene.lights.find((l) => l.id === 'key')).toMatchObject({ guideNumber: 40, calibrationOffsetStops: -0.3 });

		// Asked to, the save takes the shelf's figures as they are now.
		await save(editor, id, { baseRevision: 2, document: sampleDocument({ plan }), refreshGear: [flash.id] });
		const r3 = await getSetupRevision(editor, id, 3);
		expect(r3.document.gear[0]).toMatchObject({ name: 'Kestrel 40 (recalibrated)', spec: { guideNumberM: 36 } });
		expect((await getSetupRevision(editor, id, 1)).document.gear[0].spec).toMatchObject({ guideNumberM: 40 });

		// Searchable and filterable by gear.
		expect((await list(editor, { studio: studio.studioId, gear: flash.id })).items.map((i) => i.id)).toEqual([id]);
		expect((await list(editor, { studio: studio.studioId, q: 'recalibrated' })).items.map((i) => i.id)).toEqual([id]);
	});

	it('a gear id that is not on the shelf is refused, naming the element', async () => {
		const plan = { elements: { key: { kind: 'flash' as const, gearId: '00000000-0000-4000-8000-000000000000' } } };
		const before = await db.select({ n: sql<number>`count(*)::int` }).from(setups).where(eq(setups.studioId, studio.studioId));
		const attempt = create(editor, { studioId: studio.studioId, title: 'Bad gear', subject: 'x', document: sampleDocument({ plan }) });
		await expect(attempt).rejects.toBeInstanceOf(InputError);
		await expect(attempt).rejects.toMatchObject({ issues: [{ path: ['document', 'plan', 'elements', 'key', 'gearId'] }] });
		const after = await db.select({ n: sql<number>`count(*)::int` }).from(setups).where(eq(setups.studioId, studio.studioId));
		expect(after[0].n).toBe(before[0].n);
	});

	it('gear of another studio cannot be copied in', async () => {
		const other = await makeStudio('Other shelf');
		const theirs = await createGear(other.people.editor.user, {
			studioId: other.studioId,
			kind: 'reflector',
			name: 'Their card',
			spec: { widthM: 0.2, heightM: 0.3, reflectance: 0.9, surface: 'diffuse' },
			notes: ''
		});
		const plan = { elements: { card: { kind: 'reflector' as const, gearId: theirs.id } } };
		await expect(create(editor, { studioId: studio.studioId, title: 'x', subject: 'y', document: sampleDocument({ plan }) })).rejects.toBeInstanceOf(InputError);
	});
});

describe('reading', () => {
	it('migrates an old stored document on read and leaves the stored row as it was', async () => {
		const { id } = await create(editor, { studioId: studio.studioId, title: 'Old format', subject: 'x', document: sampleDocument() });
		const v0 = { schemaVersion: 0, scene: sampleDocument().scene, layout: { key: { angle: 30, w: 0.1 } }, notes: ['old', 'notes'] };
		await db.update(setupRevisions).set({ document: v0 }).where(and(eq(setupRevisions.setupId, id), eq(setupRevisions.number, 1)));
		const detail = await getSetup(editor, id);
		expect(detail.migratedFrom).toBe(0);
		expect(detail.document).toMatchObject({ schemaVersion: CURRENT_SCHEMA_VERSION, notes: 'old\nnotes', plan: { elements: { key: { rotationDeg: 30, widthM: 0.1 } } } });
		const [stored] = await db.select({ d: setupRevisions.document }).from(setupRevisions).where(eq(setupRevisions.setupId, id));
		expect(stored.d).toEqual(v0);
		expect((await setupExposure(editor, id)).total.exposureOffsetStops).toEqual(expect.any(Number));
		// A save on top of it writes the current version.
		await save(editor, id, { baseRevision: 1, document: detail.document });
		const [r2] = await db
			.select({ d: setupRevisions.document })
			.from(setupRevisions)
			.where(and(eq(setupRevisions.setupId, id), eq(setupRevisions.number, 2)));
		expect((r2.d as { schemaVersion: number }).schemaVersion).toBe(CURRENT_SCHEMA_VERSION);
	});

	it('the list searches title, subject and tags, filters by tag and pages', async () => {
		const s = await makeStudio('List studio');
		const ed = s.people.editor.user;
		for (let i = 0; i < 5; i++) {
			await create(ed, { studioId: s.studioId, title: `Trilobite plate ${i}`, subject: i % 2 ? 'Calymene' : 'Phacops', tags: i < 2 ? ['fossils', 'Raking light'] : ['fossils'], document: sampleDocument() });
		}
		const all = await list(ed, { studio: s.studioId, pageSize: '2' });
		expect(all.total).toBe(5);
		expect(all.items).toHaveLength(2);
		expect(all.items[0].title).toBe('Trilobite plate 4');
		const page3 = await list(ed, { studio: s.studioId, pageSize: '2', page: '3' });
		expect(page3.items.map((i) => i.title)).toEqual(['Trilobite plate 0']);
		// The total from a page that is not full, from the count after a full page and past the end.
		expect(page3.total).toBe(5);
		const pastTheEnd = await list(ed, { studio: s.studioId, pageSize: '2', page: '4' });
		expect(pastTheEnd).toMatchObject({ items: [], total: 5 });
		expect((await list(ed, { studio: s.studioId, q: 'plate PHACOPS', pageSize: '2' })).total).toBe(3);
		expect((await list(ed, { studio: s.studioId, q: 'plate PHACOPS', pageSize: '2', page: '2' })).total).toBe(3);
		expect((await list(ed, { studio: s.studioId, q: 'calym' })).total).toBe(2);
		expect((await list(ed, { studio: s.studioId, q: 'plate PHACOPS' })).total).toBe(3);
		expect((await list(ed, { studio: s.studioId, tag: 'raking light' })).total).toBe(2);
		expect((await list(ed, { studio: s.studioId, q: '100%' })).total).toBe(0);
		expect((await list(ed, { studio: s.studioId, sort: 'title', pageSize: '1' })).items[0].title).toBe('Trilobite plate 0');
		// Without a studio: every studio the caller can view, and no other.
		const mine = await list(ed, {});
		expect(new Set(mine.items.map((i) => i.studioId))).toEqual(new Set([s.studioId]));
		expect((await list(studio.people.none.user, { q: 'trilobite' })).total).toBe(0);
		expect((await list(studio.people.admin.user, { q: 'trilobite plate' })).total).toBeGreaterThanOrEqual(5);
	});
});

describe('the kept count of a studio’s setups', () => {
	it('matches a real count after creates, duplicates, trash, restores, moves, bulk SQL and deletes', async () => {
		const s = await makeStudio('Count studio');
		const ed = s.people.editor.user;
		const real = async () => {
			const rows = await db
				.select({ live: sql<number>`count(*) filter (where ${setups.deletedAt} is null)::int`, trashed: sql<number>`count(*) filter (where ${setups.deletedAt} is not null)::int` })
				.from(setups)
				.where(eq(setups.studioId, s.studioId));
			return rows[0];
		};
		const kept = async () => {
			const [row] = await db.select().from(studioSetupCounts).where(eq(studioSetupCounts.studioId, s.studioId));
			return { live: row?.live ?? 0, trashed: row?.trashed ?? 0 };
		};
		const check = async (expected: { live: number; trashed: number }) => {
			expect(await kept()).toEqual(expected);
			expect(await real()).toEqual(expected);
			expect((await list(ed, { studio: s.studioId })).total).toBe(expected.live);
			expect((await listTrash(ed, setupListQuerySchema.parse({ studio: s.studioId }))).total).toBe(expected.trashed);
		};
		await check({ live: 0, trashed: 0 });
		const a = await create(ed, { studioId: s.studioId, title: 'A', subject: 'x', document: sampleDocument() });
		const b = await create(ed, { studioId: s.studioId, title: 'B', subject: 'x', document: sampleDocument() });
		await duplicateSetup(ed, a.id, { subject: 'copy' });
		await save(ed, a.id, { baseRevision: 1, document: sampleDocument({ notes: 'saves do not count' }) });
		await check({ live: 3, trashed: 0 });
		await trashSetup(ed, a.id);
		await trashSetup(ed, b.id);
		await check({ live: 1, trashed: 2 });
		await untrashSetup(ed, b.id);
		await check({ live: 2, trashed: 1 });
		await db.insert(setups).values(Array.from({ length: 25 }, (_, i) => ({ studioId: s.studioId, title: `Bulk ${i}`, searchText: `bulk ${i}` })));
		await check({ live: 27, trashed: 1 });
		await db.update(setups).set({ deletedAt: new Date() }).where(sql`${setups.studioId} = ${s.studioId} and ${setups.title} like 'Bulk 1%'`);
		await check({ live: 16, trashed: 12 });
		await db.delete(setups).where(sql`${setups.studioId} = ${s.studioId} and ${setups.title} like 'Bulk%'`);
		await check({ live: 2, trashed: 1 });
		// A setup moved to another studio (by SQL; the app has no move yet) leaves one count for the other.
		const other = await makeStudio('Count studio 2');
		await db.update(setups).set({ studioId: other.studioId }).where(eq(setups.id, b.id));
		await check({ live: 1, trashed: 1 });
		const [moved] = await db.select().from(studioSetupCounts).where(eq(studioSetupCounts.studioId, other.studioId));
		expect(moved).toMatchObject({ live: 1, trashed: 0 });
		// Filtered lists are counted, not read from the kept count.
		expect((await list(ed, { studio: s.studioId, q: 'copy' })).total).toBe(1);
	});
});

describe('gear shelf rules', () => {
	it('a viewer sees the shelf but cannot change it; an unknown spec is named', async () => {
		const item = await createGear(editor, { studioId: studio.studioId, kind: 'modifier', name: 'Dome', spec: { shape: 'dome', lossStops: 1, beamAngleDeg: 120 }, notes: '' });
		await expect(updateGear(viewer, item.id, { name: 'Mine now' })).rejects.toMatchObject({ status: 403 });
		await expect(updateGear(editor, item.id, { spec: { lossStops: -2, beamAngleDeg: 120 } })).rejects.toMatchObject({ issues: [{ path: ['spec', 'lossStops'] }] });
		const retired = await updateGear(editor, item.id, { retired: true });
		expect(retired.retiredAt).not.toBeNull();
		const [row] = await db.select().from(gear).where(eq(gear.id, item.id));
		expect(row.retiredAt).not.toBeNull();
		expect((await updateGear(editor, item.id, { retired: false })).retiredAt).toBeNull();
	});
});
