// Seeds the demo notebook (gear shelf and setups with their revisions) into the club studio.
// Idempotent: fixed ids, and rows already there are left as they are.
import { eq, inArray, sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { flashCalibrations, gear, setupRevisions, setups, users } from '$lib/server/db/schema';
import { recordTypedCalibration } from '$lib/server/db/queries/gear';
import { referencedGearIds, withGearCalibrations } from '$lib/scene/document';
import { migrateDocument } from '$lib/scene/migrations';
import { DEMO_GEAR, DEMO_SETUPS, type DemoAuthor, type DemoGear } from './notebook-data';

const AUTHOR_EMAILS: Record<DemoAuthor, string> = {
	mara: 'mara.quill@fernhill.example',
	tobias: 'tobias.wren@fernhill.example'
};

export async function seedNotebook(studioId: string) {
	const people = await db
		.select({ id: users.id, email: users.email })
		.from(users)
		.where(inArray(users.email, Object.values(AUTHOR_EMAILS)));
	const idOf = (who: DemoAuthor) => {
		const row = people.find((p) => p.email === AUTHOR_EMAILS[who]);
		if (!row) throw new Error(`seed: demo user ${AUTHOR_EMAILS[who]} is missing; seed the users first`);
		return row.id;
	};

	const shelf = Object.values(DEMO_GEAR) as DemoGear[];
	await db
		.insert(gear)
		.values(
			shelf.map((g) => ({
				id: g.id,
				studioId,
				kind: g.kind,
				name: g.name,
				spec: g.spec,
				notes: g.notes,
				createdById: idOf('mara'),
				createdAt: new Date('2026-09-29T18:00:00Z'),
				updatedAt: new Date('2026-09-29T18:00:00Z'),
				retiredAt: g.retired ? new Date('2026-10-01T18:00:00Z') : null
			}))
		)
		.onConflictDoNothing({ target: gear.id });
	// An offset typed on the demo shelf is the first entry of that flash's calibration history, as the gear form records it.
	const typed = shelf.filter((g) => g.kind === 'flash' && Number(g.spec.calibrationOffsetStops ?? 0) !== 0);
	const recorded = new Set((await db.select({ gearId: flashCalibrations.gearId }).from(flashCalibrations).where(inArray(flashCalibrations.gearId, typed.map((g) => g.id)))).map((r) => r.gearId));
	for (const g of typed.filter((t) => !recorded.has(t.id))) {
		await recordTypedCalibration(g.id, { offsetStops: Number(g.spec.calibrationOffsetStops), ratedGuideNumberM: Number(g.spec.guideNumberM), createdById: idOf('mara') });
	}

	let revisions = 0;
	for (const demo of DEMO_SETUPS) {
		const docs = demo.revisions.map((r, i) => {
			const m = migrateDocument(r.document);
			if (!m.ok) throw new Error(`seed: "${demo.title}" revision ${i + 1}: ${m.message}`);
			// As a save does: each flash drawn from the shelf carries its calibration in the scene.
			return withGearCalibrations(m.document);
		});
		const last = docs[docs.length - 1];
		const first = demo.revisions[0];
		const latest = demo.revisions[demo.revisions.length - 1];
		const names = last.gear.map((g) => g.name);
		await db.transaction(async (tx) => {
			await tx
				.insert(setups)
				.values({
					id: demo.id,
					studioId,
					title: demo.title,
					subject: demo.subject,
					tags: demo.tags,
					latestRevision: demo.revisions.length,
					derivedFromSetupId: demo.derivedFrom?.setupId ?? null,
					derivedFromRevision: demo.derivedFrom?.revisionNumber ?? null,
					gearIds: referencedGearIds(last),
					searchText: [demo.title, demo.subject, ...demo.tags, ...names].join(' ').toLowerCase(),
					createdById: idOf(first.author),
					createdAt: new Date(first.at),
					updatedAt: new Date(latest.at)
				})
				.onConflictDoNothing({ target: setups.id });
			const inserted = await tx
				.insert(setupRevisions)
				.values(
					demo.revisions.map((r, i) => ({
						setupId: demo.id,
						number: i + 1,
						parentNumber: i === 0 ? null : i,
						document: docs[i],
						title: demo.title,
						subject: demo.subject,
						tags: demo.tags,
						authorId: idOf(r.author),
						message: r.message,
						createdAt: new Date(r.at)
					}))
				)
				.onConflictDoNothing({ target: [setupRevisions.setupId, setupRevisions.number] })
				.returning({ n: setupRevisions.number });
			revisions += inserted.length;
			// A database seeded before a demo revision was added gets it now: the setup's latest moves up to it.
			if (inserted.length) {
				await tx
					.update(setups)
					.set({ latestRevision: sql`greatest(${setups.latestRevision}, ${demo.revisions.length})` })
					.where(eq(setups.id, demo.id));
			}
		});
	}
	return { gear: shelf.length, setups: DEMO_SETUPS.map((s) => s.title), revisionsAdded: revisions };
}
