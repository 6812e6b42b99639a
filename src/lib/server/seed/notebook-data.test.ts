// The demo notebook must be data the product accepts: every revision passes today's checks, its gear
// copies are exactly the gear its plan names, and the latest revisions are exposures a club member would
// keep (within a stop and a half; the geode is a third of a stop over on purpose, its message says so).
import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { referencedGearIds } from '$lib/scene/document';
import { gearSpecSchemas } from '$lib/scene/gear';
import { migrateDocument } from '$lib/scene/migrations';
import { modelFromDocument } from '$lib/editor/model/document';
import { toExposureScene } from '$lib/editor/model/scene';
import { DEMO_GEAR, DEMO_SETUP_IDS, DEMO_SETUPS, type DemoGear } from './notebook-data';

const read = (raw: unknown) => {
	const r = migrateDocument(raw);
	if (!r.ok) throw new Error(r.message);
	return r.document;
};

describe('demo notebook data', () => {
	it('holds the three setups of the scenario and one duplicate, each with several revisions', () => {
		expect(DEMO_SETUPS.map((s) => s.title)).toEqual([
			'Quartz cluster on black velvet',
			'Ammonite section, raking light from the left',
			'Dew-covered moss on the window sill',
			'Amethyst geode on black velvet'
		]);
		for (const s of DEMO_SETUPS) expect(s.revisions.length, s.title).toBeGreaterThanOrEqual(2);
		const byMoreThanOne = DEMO_SETUPS.filter((s) => new Set(s.revisions.map((r) => r.author)).size > 1);
		expect(byMoreThanOne.length).toBeGreaterThanOrEqual(2);
		expect(new Set(DEMO_SETUPS.flatMap((s) => s.revisions.map((r) => r.author)))).toEqual(new Set(['mara', 'tobias']));
	});

	it('every revision is a valid document whose gear copies match the plan', () => {
		for (const s of DEMO_SETUPS) {
			s.revisions.forEach((r, i) => {
				const doc = read(r.document);
				expect(doc.gear.map((g) => g.id).sort(), `${s.title} r${i + 1}`).toEqual(referencedGearIds(doc));
			});
		}
	});

	it('the editor reads every revision, also as stored at version 1, and keeps its numbers', () => {
		for (const s of DEMO_SETUPS) {
			s.revisions.forEach((r, i) => {
				const stored = r.document as { scene: unknown; plan: { elements?: Record<string, { kind?: string }> } };
				// A database seeded before version 2 holds the same revision without the ambient light's plan entry.
				const elements = Object.fromEntries(Object.entries(stored.plan.elements ?? {}).filter(([, e]) => e.kind !== 'ambient'));
				for (const raw of [r.document, { ...stored, schemaVersion: 1, plan: { ...stored.plan, elements } }]) {
					const doc = read(structuredClone(raw));
					const before = computeExposure(doc.scene);
					const { model, notes } = modelFromDocument(doc);
					expect(notes, `${s.title} r${i + 1}`).toEqual([]);
					const after = computeExposure(toExposureScene(model));
					expect(after.total.exposureOffsetStops!, `${s.title} r${i + 1}`).toBeCloseTo(before.total.exposureOffsetStops!, 9);
					expect(after.lights.map((l) => [l.id, l.x.toPrecision(9)])).toEqual(before.lights.map((l) => [l.id, l.x.toPrecision(9)]));
					expect(toExposureScene(model).ambient).toEqual(doc.scene.ambient);
				}
			});
		}
	});

	it('the duplicate starts from its origin’s revision exactly', () => {
		const amethyst = DEMO_SETUPS.find((s) => s.id === DEMO_SETUP_IDS.amethyst)!;
		const quartz = DEMO_SETUPS.find((s) => s.id === DEMO_SETUP_IDS.quartz)!;
		expect(amethyst.derivedFrom).toEqual({ setupId: quartz.id, revisionNumber: 4 });
		expect(amethyst.revisions[0].document).toEqual(quartz.revisions[3].document);
	});

	it('revisions are in time order', () => {
		for (const s of DEMO_SETUPS) {
			const times = s.revisions.map((r) => Date.parse(r.at));
			expect([...times].sort((a, b) => a - b)).toEqual(times);
		}
	});

	it('latest revisions expose within a stop and a half', () => {
		for (const s of DEMO_SETUPS) {
			const doc = read(s.revisions[s.revisions.length - 1].document);
			const stops = computeExposure(doc.scene).total.exposureOffsetStops;
			expect(stops, s.title).not.toBeNull();
			expect(Math.abs(stops!), s.title).toBeLessThan(1.5);
		}
	});

	it('the gear shelf is valid, with a retired item', () => {
		const shelf = Object.values(DEMO_GEAR) as DemoGear[];
		for (const g of shelf) expect(gearSpecSchemas[g.kind].safeParse(g.spec).success, g.name).toBe(true);
		expect(new Set(shelf.map((g) => g.kind))).toEqual(new Set(['flash', 'modifier', 'reflector', 'lens', 'camera']));
		expect(shelf.some((g) => g.retired)).toBe(true);
		expect(new Set(shelf.map((g) => g.id)).size).toBe(shelf.length);
	});
});
