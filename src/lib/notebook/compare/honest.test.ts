// The comparison reports only what changed. First the false reports once seen on the seeded demo
// setups, reproduced; then properties over random edits made with the editor's own commands.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DEMO_SETUPS } from '$lib/server/seed/notebook-data';
import { setupDocumentSchema, type SetupDocument } from '$lib/scene/document';
import { documentFromModel, modelFromDocument } from '$lib/editor/model/document';
import { applyDiff } from '$lib/editor/model/diff';
import { moveElementsBy, rotateElementsBy, type Command } from '$lib/editor/commands';
import { setCameraSettings, setElementProperties } from '$lib/editor/commands-properties';
import type { EditorModel } from '$lib/editor/model/types';
import { exposureSceneSchema } from '$lib/light/schema';
import { compareDocuments, comparisonSentences, type Comparison } from './index';

const seeded = DEMO_SETUPS.flatMap((s) => s.revisions.map((r, i) => ({ name: `${s.title}, revision ${i + 1}`, doc: setupDocumentSchema.parse(r.document) })));
const seededNamed = (title: string, revision: number) => seeded.find((s) => s.name === `${title}, revision ${revision}`)!.doc;

function run(model: EditorModel, command: Command): EditorModel {
	const result = command(model);
	if (!result.ok) throw new Error(`the edit was refused: ${result.error.message}`);
	return applyDiff(model, result.diff);
}

const save = (model: EditorModel, doc: SetupDocument) => documentFromModel(model, doc.notes, doc.gear);

/** Every entry that names a change, with the element (or setting) it names. */
function entries(c: Comparison): { id: string; text: string }[] {
	return [
		...c.added,
		...c.removed,
		...c.moved,
		...c.altered,
		...c.gear,
		...c.settings.map((s) => ({ id: `camera.${s.setting}`, text: s.text }))
	].map((e) => ({ id: e.id, text: e.text }));
}

describe('the false reports once seen, after only a reflector moved in the editor', () => {
	// The seeded document as stored, against what the editor saved after one drag of the silver
	// reflector: the editor writes a plan rotation from the scene's normal, a beam aim as a point one
	// metre out, a panel size from the card's area, and a flag's size where the plan had none.
	const stored = seededNamed('Ammonite section, raking light from the left', 3);
	const { model } = modelFromDocument(stored);
	const saved = save(run(model, moveElementsBy(['silver'], 0.05, 0)), stored);
	const c = compareDocuments(stored, saved);
	const said = comparisonSentences(c).join('\n');

	it('reports the move and nothing else', () => {
		expect(entries(c)).toEqual([{ id: 'silver', text: 'Reflector “Silver reflector” moved 5 cm: now 35.3 cm from the subject (was 30.4 cm)' }]);
	});

	it('no turn of 90°: the card faces where its normal says, as before', () => expect(said).not.toMatch(/turned/));
	it('no re-aimed flash: the beam points the same way', () => expect(said).not.toMatch(/aim/));
	it('no “900 cm² → 900 cm²”: the area reads the same', () => expect(said).not.toMatch(/area|900 cm²/));
	it('no “resized 30 cm × 1 cm → 36.7 × 1 × 24.5 cm”, no “no size → 17 cm × 30 cm”', () => expect(said).not.toMatch(/resized|no size/));

	it('the quartz cluster’s card dragged: only the card', () => {
		const quartz = seededNamed('Quartz cluster on black velvet', 4);
		const m = modelFromDocument(quartz).model;
		const d = compareDocuments(quartz, save(run(m, moveElementsBy(['card'], 0, 0.04)), quartz));
		expect(entries(d).map((e) => e.id)).toEqual(['card']);
	});
});

describe('rounding never flips a sign', () => {
	// One flash, GN 10 at 1 m, f/16, ISO 100: 2·log2(10·√p / 16) stops over (guide-number formula
	// GN = d × N, ISO 1230; from memory). Powers chosen for −4.24 and −3.26 stops.
	const scene = (power: number) =>
		exposureSceneSchema.parse({
			camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0 },
			subject: { position: [0, 0, 0] },
			lights: [{ id: 'key', kind: 'flash', position: [1, 0, 0], guideNumber: 10, power }]
		});
	const powerFor = (stops: number) => 2 ** (stops - 2 * Math.log2(10 / 16));

	it('−4.2 → −3.3 stops is +0.9 stops, not “+1 stop”', () => {
		const c = compareDocuments({ scene: scene(powerFor(-4.24)) }, { scene: scene(powerFor(-3.26)) });
		expect(c.exposure.beforeStops).toBeCloseTo(-4.24, 9);
		expect(c.exposure.afterStops).toBeCloseTo(-3.26, 9);
		expect(c.exposure.text).toBe('Exposure +0.9 stops: −4.2 stops at f/16 → −3.3 stops at f/16.');
		expect(c.exposure.lights[0].text).toBe('Flash “key”: +0.9 stops (−4.2 stops → −3.3 stops)');
	});

	it('a difference too small to print is “unchanged”, never a sign', () => {
		fc.assert(
			fc.property(fc.double({ min: -8, max: -1.6, noNaN: true }), fc.double({ min: -0.2, max: 0.2, noNaN: true }), (stops, change) => {
				const c = compareDocuments({ scene: scene(powerFor(stops)) }, { scene: scene(powerFor(stops + change)) });
				const printed = c.exposure.text.match(/^Exposure ([+−])/);
				const shownBefore = Number(c.exposure.beforeStops!.toFixed(1));
				const shownAfter = Number(c.exposure.afterStops!.toFixed(1));
				if (shownBefore === shownAfter) expect(c.exposure.text).toMatch(/^Exposure unchanged/);
				else expect(printed?.[1]).toBe(c.exposure.afterStops! > c.exposure.beforeStops! ? '+' : '−');
			})
		);
	});
});

// ---------- random edits of the seeded documents ----------

type Edit = { describe: string; touches: string; command: Command };

/** One edit of one element or setting, as the editor's commands make it. */
function editsOf(model: EditorModel): fc.Arbitrary<Edit> {
	const unlocked = Object.values(model.elements).filter((e) => !e.locked);
	// A diffuser moved changes the loss of every light whose path it crosses: that is two changes.
	const movable = unlocked.filter((e) => e.kind !== 'diffuser');
	const lights = unlocked.filter((e) => e.kind === 'flash');
	const cards = unlocked.filter((e) => e.kind === 'reflector');
	const nonZero = (min: number, max: number) => fc.tuple(fc.double({ min, max, noNaN: true }), fc.boolean()).map(([v, negative]) => (negative ? -v : v));
	const options: fc.Arbitrary<Edit>[] = [
		fc.tuple(fc.constantFrom(...movable), nonZero(0.01, 0.3), nonZero(0.01, 0.3)).map(([el, dx, dy]) => ({
			describe: `move ${el.id} by ${dx}, ${dy}`,
			touches: el.id,
			command: moveElementsBy([el.id], dx, dy)
		})),
		fc.tuple(fc.constantFrom(...unlocked), nonZero(2, 170)).map(([el, deg]) => ({
			describe: `turn ${el.id} by ${deg}°`,
			touches: el.id,
			command: rotateElementsBy([el.id], deg)
		})),
		fc.tuple(fc.constantFrom(...unlocked), fc.string({ minLength: 1, maxLength: 20 }).filter((s) => s.trim() !== '')).map(([el, text]) => ({
			describe: `rename ${el.id}`,
			touches: el.id,
			command: setElementProperties(el.id, { label: `${el.label} (${text.trim()})` })
		})),
		fc.tuple(fc.constantFrom(1.4, 2, 2.8, 4, 5.6, 8, 11, 22, 32, 45), fc.constantFrom(50, 200, 400, 800)).map(([aperture, iso]) => ({
			describe: `aperture f/${aperture}`,
			touches: 'camera.aperture',
			command: setCameraSettings({ aperture: model.camera.aperture === aperture ? aperture * 2 : aperture, iso: model.camera.iso })
		})),
		fc.constantFrom(50, 200, 400, 800, 1600).map((iso) => ({
			describe: `ISO ${iso}`,
			touches: 'camera.iso',
			command: setCameraSettings({ iso: model.camera.iso === iso ? iso * 2 : iso })
		}))
	];
	if (lights.length) {
		options.push(
			fc.tuple(fc.constantFrom(...lights), fc.integer({ min: 0, max: 24 })).map(([el, k]) => {
				const current = el.kind === 'flash' ? el.power : 1;
				const power = 2 ** (-k / 3);
				return {
					describe: `power of ${el.id} to 2^(−${k}/3)`,
					touches: el.id,
					command: setElementProperties(el.id, { power: Math.abs(Math.log2(power / current)) < 0.3 ? power / 4 : power })
				};
			}),
			fc.tuple(fc.constantFrom(...lights), fc.integer({ min: 10, max: 60 })).map(([el, gn]) => ({
				describe: `guide number of ${el.id} to ${gn}`,
				touches: el.id,
				command: setElementProperties(el.id, { guideNumber: el.kind === 'flash' && el.guideNumber === gn ? gn + 5 : gn })
			}))
		);
	}
	if (cards.length) {
		options.push(
			fc.tuple(fc.constantFrom(...cards), fc.integer({ min: 10, max: 99 })).map(([el, percent]) => ({
				describe: `reflectance of ${el.id} to ${percent} %`,
				touches: el.id,
				command: setElementProperties(el.id, { reflectance: el.kind === 'reflector' && Math.round(el.reflectance * 100) === percent ? (percent + 5) / 100 : percent / 100 })
			}))
		);
	}
	return fc.oneof(...options);
}

describe('over random edits of the seeded documents', () => {
	// The baseline is the editor's own saving of each seeded revision: the documents people compare
	// once a setup has been saved from the editor. (A stored seed against the editor's first save is the
	// test above.)
	const cases = seeded.map(({ name, doc }) => {
		const model = modelFromDocument(doc).model;
		return { name, doc, model, base: save(model, doc) };
	});

	it('a revision against itself saved again reports nothing', () => {
		for (const { name, doc, model, base } of cases) {
			const again = save(modelFromDocument(base).model, doc);
			expect(entries(compareDocuments(base, again)), name).toEqual([]);
			expect(entries(compareDocuments(base, save(model, doc))), name).toEqual([]);
		}
	});

	for (const { name, doc, model, base } of cases) {
		it(`${name}: one edit is reported once, and nothing else is`, () => {
			fc.assert(
				fc.property(editsOf(model), (edit) => {
					const after = save(run(model, edit.command), doc);
					const found = entries(compareDocuments(base, after));
					expect(found.map((e) => e.id), `${edit.describe}: ${found.map((e) => e.text).join('; ')}`).toEqual([edit.touches]);
				}),
				{ numRuns: 150 }
			);
		});

		it(`${name}: edits of different elements are each reported once`, () => {
			fc.assert(
				fc.property(fc.array(editsOf(model), { minLength: 2, maxLength: 4 }), (edits) => {
					const distinct = edits.filter((e, i) => edits.findIndex((f) => f.touches === e.touches) === i && !e.touches.startsWith('camera.'));
					const edited = distinct.reduce((m, e) => run(m, e.command), model);
					const found = entries(compareDocuments(base, save(edited, doc)));
					const ids = found.map((e) => e.id).sort();
					expect(ids, `${distinct.map((e) => e.describe).join(', ')}: ${found.map((e) => e.text).join('; ')}`).toEqual(distinct.map((e) => e.touches).sort());
				}),
				{ numRuns: 100 }
			);
		});
	}
});
