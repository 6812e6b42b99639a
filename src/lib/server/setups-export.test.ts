// Exporting a setup to a file and importing one, against the real PostgreSQL of `npm test`
// (DATABASE_URL): a bad file creates nothing and says what is wrong; a file round-trips.
import { beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { setups } from '$lib/server/db/schema';
import { makeStudio, sampleDocument, type TestStudio } from '$lib/server/testing/notebook-fixtures';
import { createSetup, getSetup, InputError } from '$lib/server/setups';
import { exportSetup, importSetup } from '$lib/server/setups-export';
import { setupCreateSchema } from '$lib/scene/inputs';
import type { SessionUser } from '$lib/server/session';

let studio: TestStudio;
let editor: SessionUser;
let viewer: SessionUser;

const create = (user: SessionUser, raw: Record<string, unknown>) => createSetup(user, setupCreateSchema.parse(raw));

beforeAll(async () => {
	studio = await makeStudio('Export tests');
	editor = studio.people.editor.user;
	viewer = studio.people.viewer.user;
});

describe('import', () => {
	it('a bad file creates nothing and says what is wrong', async () => {
		const count = async () => (await db.select({ n: sql<number>`count(*)::int` }).from(setups)).at(0)!.n;
		const before = await count();
		const bad: [string, RegExp][] = [
			['{"formatVersion": 1, "kind": "squarelaw.setup", "title": "Cut', /truncated/],
			['not json at all', /not valid JSON/],
			[JSON.stringify({ type: 'FeatureCollection' }), /not a Squarelaw setup file/],
			['x'.repeat(1024 * 1024 + 1), /too large/],
			[JSON.stringify({ formatVersion: 1, kind: 'squarelaw.setup', title: 'x', subject: '', exportedAt: '2026-10-01T00:00:00Z', document: { schemaVersion: 1, scene: {} } }), /document\.scene/]
		];
		for (const [text, message] of bad) {
			const attempt = importSetup(editor, text, { studioId: studio.studioId });
			await expect(attempt).rejects.toBeInstanceOf(InputError);
			await expect(attempt).rejects.toThrow(message);
		}
		expect(await count()).toBe(before);
	});

	it('an exported file imports as a new setup with the same document', async () => {
		const { id } = await create(editor, { studioId: studio.studioId, title: 'Round trip', subject: 'Geode', tags: ['minerals'], document: sampleDocument({ notes: 'exported' }) });
		const { file, fileName } = await exportSetup(editor, id);
		expect(fileName).toBe('round-trip-r1.squarelaw.json');
		const imported = await importSetup(viewer, JSON.stringify(file));
		const detail = await getSetup(viewer, imported.id);
		expect(detail).toMatchObject({ title: 'Round trip', subject: 'Geode', tags: ['minerals'], studioId: studio.people.viewer.personalStudioId, derivedFrom: null });
		expect(detail.document).toEqual((await getSetup(editor, id)).document);
		await expect(importSetup(viewer, JSON.stringify(file), { studioId: studio.studioId })).rejects.toMatchObject({ status: 403 });
	});
});
