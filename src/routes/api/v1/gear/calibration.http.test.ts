// One calibration, one physics: a flash calibrated on the gear shelf at −0.7 stop costs the same 0.7 stop
// through the calculation API, in a stored revision's exposure on the server, and in the editor's live
// exposure (pure, run here); a revision saved before the calibration keeps its prediction.
// Sources: light ∝ GN², so c stops is GN × 2^(c/2) (the guide-number relation N = GN / d, any photography
// textbook); calibrating a flash against a meter or a test shot is common practice.
import { beforeAll, describe, expect, it } from 'vitest';
import { api, makeStudio, sampleDocument, type TestStudio } from '$lib/server/testing/notebook-fixtures';
import { takeFlashFromShelf } from '$lib/editor/commands-gear';
import { liveExposure } from '$lib/editor/live-exposure';
import { applyDiff } from '$lib/editor/model/diff';
import { modelFromDocument } from '$lib/editor/model/document';
import { toExposureScene } from '$lib/editor/model/scene';
import { shelfGear } from '$lib/editor/model/shelf';

let studio: TestStudio;
const as = (role: keyof TestStudio['people']) => ({ auth: { kind: 'cookie' as const, who: studio.people[role] } });
const CALIBRATION = -0.7;
const offsetOf = (answer: { total: { exposureOffsetStops: number } }) => answer.total.exposureOffsetStops;

beforeAll(async () => {
	studio = await makeStudio('One calibration studio');
});

describe('a flash calibrated at −0.7 stop', () => {
	it('gives the same exposure through the API, the stored revision and the editor; the older revision keeps its own', async () => {
		const flash = await api('POST', '/api/v1/gear', {
			...as('editor'),
			body: { studioId: studio.studioId, kind: 'flash', name: 'Kestrel 40 speedlight', spec: { guideNumberM: 40, lowestPower: 1 / 128, syncSpeedS: 1 / 250 } }
		});
		expect(flash.status).toBe(201);
		const plan = { elements: { key: { kind: 'flash' as const, label: 'Kestrel 40', gearId: flash.body.id } } };
		const created = await api('POST', '/api/v1/setups', { ...as('editor'), body: { studioId: studio.studioId, title: 'Quartz cluster', subject: 'quartz', document: sampleDocument({ plan }) } });
		expect(created.status).toBe(201);
		const setupId = created.body.id;
		const before = offsetOf((await api('GET', `/api/v1/setups/${setupId}/exposure`, as('viewer'))).body);

		// A flash-meter reading at 2 m, ISO 100, full power: f/(40 × 2^(−0.35) / 2), 0.7 stop under its rating.
		const aperture = (40 * 2 ** (CALIBRATION / 2)) / 2;
		const calibrated = await api('POST', `/api/v1/setups/${setupId}/shots/calibrate`, { ...as('editor'), body: { method: 'meter', gearId: flash.body.id, aperture, distanceM: 2, iso: 100, power: 1 } });
		expect(calibrated.status, JSON.stringify(calibrated.body)).toBe(201);
		expect(calibrated.body.calibration.offsetStops).toBeCloseTo(CALIBRATION, 9);
		// The shelf holds it as the flash's one offset; the guide number stays the rated one.
		const shelf = await api('GET', `/api/v1/gear?studio=${studio.studioId}&kind=flash`, as('viewer'));
		const onShelf = shelf.body.items.find((g: { id: string }) => g.id === flash.body.id);
		expect(onShelf.spec).toMatchObject({ guideNumberM: 40 });
		expect(onShelf.spec.calibrationOffsetStops).toBeCloseTo(CALIBRATION, 9);

		// A save from now on carries it in its scene, beside the rated guide number.
		const latest = (await api('GET', `/api/v1/setups/${setupId}`, as('editor'))).body;
		const saved = await api('PUT', `/api/v1/setups/${setupId}`, { ...as('editor'), body: { baseRevision: latest.revisionNumber, document: latest.document, message: 'after calibrating' } });
		expect(saved.status).toBe(200);
		const revision2 = (await api('GET', `/api/v1/setups/${setupId}/revisions/${saved.body.revisionNumber}`, as('viewer'))).body;
		const key = revision2.document.scene.lights.find((l: { id: string }) => l.id === 'key');
		expect(key.guideNumber).toBe(40);
		expect(key.calibrationOffsetStops).toBeCloseTo(CALIBRATION, 9);

		// 1. The server's stored-revision exposure.
		const stored = offsetOf((await api('GET', `/api/v1/setups/${setupId}/exposure`, as('viewer'))).body);
		// 2. The calculation API with that scene.
		const calc = await api('POST', '/api/v1/exposure', { auth: { kind: 'anonymous' }, body: revision2.document.scene });
		expect(calc.status).toBe(200);
		// 3. The editor: revision 1 opened, the flash taken from the shelf as the inspector does, live exposure in the browser's engine.
		const revision1 = (await api('GET', `/api/v1/setups/${setupId}/revisions/1`, as('viewer'))).body;
		const { model } = modelFromDocument(revision1.document);
		const taken = takeFlashFromShelf('key', shelfGear(shelf.body.items).flashes.find((f) => f.id === flash.body.id)!)(model);
		if (!taken.ok) throw new Error(taken.error.message);
		const live = liveExposure(toExposureScene(applyDiff(model, taken.diff)));
		expect(live.ok).toBe(true);

		// Every light here is the flash or a card it lights, so the whole exposure moves by the calibration.
		expect(stored - before).toBeCloseTo(CALIBRATION, 9);
		expect(offsetOf(calc.body)).toBeCloseTo(stored, 9);
		expect(live.ok && live.result.total.exposureOffsetStops).toBeCloseTo(stored, 9);

		// Revision 1 was saved before the calibration: it predicts as it did, and a later calibration changes nothing in either.
		expect(offsetOf((await api('GET', `/api/v1/setups/${setupId}/exposure?revision=1`, as('viewer'))).body)).toBeCloseTo(before, 9);
		const again = await api('POST', `/api/v1/setups/${setupId}/shots/calibrate`, { ...as('editor'), body: { method: 'meter', gearId: flash.body.id, aperture: 20, distanceM: 2, iso: 100, power: 1 } });
		expect(again.status).toBe(201);
		expect(offsetOf((await api('GET', `/api/v1/setups/${setupId}/exposure?revision=1`, as('viewer'))).body)).toBeCloseTo(before, 9);
		expect(offsetOf((await api('GET', `/api/v1/setups/${setupId}/exposure?revision=${saved.body.revisionNumber}`, as('viewer'))).body)).toBeCloseTo(stored, 9);
	});
});
