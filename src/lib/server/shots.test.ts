// The shots service against the real PostgreSQL and the storage fake of `npm test` (S3_* from the
// scripts), with images made by sharp with known pixels and EXIF. The storage-outage case starts a
// storage fake of its own and stops it part-way through an upload. Nothing is mocked.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { shots, storageLeftovers } from '$lib/server/db/schema';
import { makeStudio, sampleDocument, type TestStudio } from '$lib/server/testing/notebook-fixtures';
import { SAMPLE_EXIF, testImage } from '$lib/server/testing/shot-images';
import { createSetup, saveSetup, getSetup, setupExposure } from '$lib/server/setups';
import { createGear, getGear, updateGear } from '$lib/server/gear';
import { setupCreateSchema, setupSaveSchema } from '$lib/scene/inputs';
import { gearCreateSchema } from '$lib/scene/gear';
import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema } from '$lib/light/schema';
import { srgbToLinear } from '$lib/shots/measure';
import { calibrationSchema } from '$lib/shots/types';
import { calibrateFlash, listCalibrations, undoCalibration } from './calibrations';
import { getShot, listShots, measureShot, restoreShot, trashShot, updateShot, uploadShots, type UploadFile } from './shots';
import { ObjectStore, objectStore, useObjectStore } from './storage';

let studio: TestStudio;
let setupId: string;

const file = (name: string, bytes: Uint8Array): UploadFile => ({ name, type: 'image/jpeg', size: bytes.byteLength, bytes: async () => bytes });

/** The sRGB code whose linear value is 18 % × 2^stops (IEC 61966-2-1 inverted), for a shot that should measure `stops`. */
function codeFor(stops: number) {
	const target = 0.18 * 2 ** stops;
	let best = 0;
	for (let c = 0; c < 256; c++) if (Math.abs(srgbToLinear(c / 255) - target) < Math.abs(srgbToLinear(best / 255) - target)) best = c;
	return best;
}

beforeAll(async () => {
	studio = await makeStudio('Shots studio');
	const created = await createSetup(studio.people.editor.user, setupCreateSchema.parse({ studioId: studio.studioId, title: 'Quartz cluster on velvet', subject: 'quartz', document: sampleDocument() }));
	setupId = created.id;
});

describe('upload', () => {
	it('stores a good file whole (original, preview, thumbnail and row) and reads its EXIF', async () => {
		const bytes = await testImage({ exif: SAMPLE_EXIF, model: 'Fernhill Test Camera', width: 300, height: 200 });
		const result = await uploadShots(studio.people.editor.user, setupId, [file('quartz-01.jpg', bytes)]);
		expect(result.failed).toEqual([]);
		const [shot] = result.created;
		expect(shot).toMatchObject({ fileName: 'quartz-01.jpg', revisionNumber: 1, widthPx: 300, heightPx: 200, contentType: 'image/jpeg' });
		expect(shot.settings).toMatchObject({ fNumber: 16, exposureTimeS: 1 / 125, iso: 100, sources: { fNumber: 'exif', iso: 'exif' } });
		const [row] = await db.select().from(shots).where(eq(shots.id, shot.id));
		const store = objectStore();
		expect(Buffer.from((await store.get(row.originalKey))!).equals(bytes)).toBe(true);
		expect(await store.exists(row.previewKey)).toBe(true);
		expect(await store.exists(row.thumbnailKey)).toBe(true);
	});

	it('takes the good files of a batch and names each bad one with what is wrong', async () => {
		const good = await testImage({ exif: SAMPLE_EXIF });
		const jpeg = await testImage({ width: 200, height: 150, rgb: [10, 200, 60] });
		const result = await uploadShots(studio.people.editor.user, setupId, [
			file('good.jpg', good),
			file('broken.jpg', jpeg.subarray(0, jpeg.length / 2)),
			file('empty.jpg', new Uint8Array(0)),
			file('notes.txt', new TextEncoder().encode('not a picture')),
			file('../../escape.jpg', good),
			file('rtl\u202egpj.exe', good),
			file('good-too.png', await testImage({ format: 'png' }))
		]);
		expect(result.created.map((s) => s.fileName)).toEqual(['good.jpg', 'good-too.png']);
		const messages = Object.fromEntries(result.failed.map((f) => [f.fileName, f.message]));
		expect(messages['broken.jpg']).toMatch(/^broken\.jpg: the image is truncated or corrupt/);
		expect(messages['empty.jpg']).toMatch(/^empty\.jpg: the file is empty/);
		expect(messages['notes.txt']).toMatch(/^notes\.txt: this is not an image/);
		expect(messages['../../escape.jpg']).toMatch(/must not contain a path/);
		expect(Object.values(messages).some((m) => /direction-changing/.test(m))).toBe(true);
		const names = (await listShots(studio.people.viewer.user, setupId)).shots.map((s) => s.fileName);
		expect(names).not.toContain('broken.jpg');
	});

	it('removes the original of a truncated file again (it is written while sharp decodes it)', async () => {
		const keysPut: string[] = [];
		class RecordingStore extends ObjectStore {
			async put(key: string, body: Uint8Array, type: string) {
				keysPut.push(key);
				return super.put(key, body, type);
			}
		}
		const store = new RecordingStore(objectStore().config);
		useObjectStore(store);
		try {
			const jpeg = await testImage({ width: 400, height: 300, rgb: [200, 30, 90] });
			const result = await uploadShots(studio.people.editor.user, setupId, [file('cut-short.jpg', jpeg.subarray(0, jpeg.length / 2))]);
			expect(result.failed.map((f) => f.message)).toEqual([expect.stringMatching(/^cut-short\.jpg: the image is truncated or corrupt/)]);
			expect(keysPut).toEqual([expect.stringMatching(new RegExp(`^shots/${setupId}/[0-9a-f-]+/original$`))]);
			expect(await store.exists(keysPut[0])).toBe(false);
			expect(await db.select().from(storageLeftovers).where(eq(storageLeftovers.key, keysPut[0]))).toHaveLength(0);
		} finally {
			useObjectStore(null);
		}
	});

	it('keeps nothing of a file when storage stops part-way, and removes its objects once storage is back', async () => {
		const S3rver = (await import('s3rver')).default;
		const directory = fs.mkdtempSync(path.join(os.tmpdir(), 'squarelaw-s3-'));
		const start = async () => {
			const server = new S3rver({ address: '127.0.0.1', port: 0, directory, silent: true, configureBuckets: [{ name: 'outage' }] });
			const address = await server.run();
			return { server, port: address.port };
		};
		let fake = await start();
		const config = { endpoint: `http://127.0.0.1:${fake.port}`, bucket: 'outage', region: 'us-east-1', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', forcePathStyle: true };
		let puts = 0;
		const keysPut: string[] = [];
		/**
		 * The real client; the fake is really stopped once the second file's original is stored, before its
		 * preview (written at the same time) reaches it.
		 */
		let stopped: Promise<void> | null = null;
		class StoppingStore extends ObjectStore {
			async put(key: string, body: Uint8Array, type: string) {
				puts += 1;
				keysPut.push(key);
				if (puts === 4) return (stopped = super.put(key, body, type).then(() => fake.server.close()));
				if (stopped) await stopped;
				return super.put(key, body, type);
			}
		}
		const before = (await listShots(studio.people.editor.user, setupId)).shots.length;
		useObjectStore(new StoppingStore(config));
		try {
			const bytes = await testImage({ exif: SAMPLE_EXIF });
			const result = await uploadShots(studio.people.editor.user, setupId, [file('first.jpg', bytes), file('second.jpg', bytes), file('third.jpg', bytes)]);
			expect(result.created.map((s) => s.fileName)).toEqual(['first.jpg']);
			expect(result.failed.map((f) => f.message)).toEqual([
				'second.jpg: not kept, storage is unreachable; nothing of it was stored, try again',
				'third.jpg: not kept, storage is unreachable; nothing of it was stored, try again'
			]);
			expect((await listShots(studio.people.editor.user, setupId)).shots.length).toBe(before + 1);
			// The second file's original went in before the stop: noted for removal, no row points at it.
			const secondOriginal = keysPut[3];
			const noted = await db.select().from(storageLeftovers).where(eq(storageLeftovers.key, secondOriginal));
			expect(noted).toHaveLength(1);
			expect(await db.select().from(shots).where(eq(shots.originalKey, secondOriginal))).toHaveLength(0);
			// Storage back on the same port and folder: the next upload removes the leftover first.
			const again = new (await import('s3rver')).default({ address: '127.0.0.1', port: fake.port, directory, silent: true, configureBuckets: [{ name: 'outage' }] });
			await again.run();
			fake = { server: again, port: fake.port };
			const probe = new ObjectStore(config);
			expect(await probe.exists(secondOriginal)).toBe(true);
			await uploadShots(studio.people.editor.user, setupId, [file('fourth.jpg', bytes)]);
			expect(await probe.exists(secondOriginal)).toBe(false);
			expect(await db.select().from(storageLeftovers).where(eq(storageLeftovers.key, secondOriginal))).toHaveLength(0);
		} finally {
			useObjectStore(null);
			await fake.server.close().catch(() => {});
			fs.rmSync(directory, { recursive: true, force: true });
		}
	});
});

describe('roles', () => {
	it('lets viewers read, editors write; others see a 404', async () => {
		const bytes = await testImage({ exif: SAMPLE_EXIF });
		await expect(uploadShots(studio.people.viewer.user, setupId, [file('v.jpg', bytes)])).rejects.toMatchObject({ status: 403 });
		await expect(uploadShots(studio.people.none.user, setupId, [file('n.jpg', bytes)])).rejects.toMatchObject({ status: 404 });
		const { created } = await uploadShots(studio.people.owner.user, setupId, [file('o.jpg', bytes)]);
		const id = created[0].id;
		expect((await getShot(studio.people.viewer.user, setupId, id)).id).toBe(id);
		await expect(getShot(studio.people.none.user, setupId, id)).rejects.toMatchObject({ status: 404 });
		await expect(trashShot(studio.people.viewer.user, setupId, id)).rejects.toMatchObject({ status: 403 });
		await expect(measureShot(studio.people.viewer.user, setupId, id, { method: 'meter', meter: { aperture: 16 } })).rejects.toMatchObject({ status: 403 });
		expect((await getShot(studio.people.admin.user, setupId, id)).id).toBe(id);
	});
});

describe('trash, typed values and revisions', () => {
	it('moves a shot to the trash and back, types values in and clears them', async () => {
		const { created } = await uploadShots(studio.people.editor.user, setupId, [file('plain.png', await testImage({ format: 'png' }))]);
		const id = created[0].id;
		expect(created[0].settings.sources.fNumber).toBe('not recorded');
		expect(created[0].predicted).toMatchObject({ offsetStops: null, reason: expect.stringMatching(/not recorded: f-number, shutter, ISO/) });
		const typed = await updateShot(studio.people.editor.user, setupId, id, { typed: { fNumber: 11, exposureTimeS: 0.005, iso: 200 } });
		expect(typed.settings).toMatchObject({ fNumber: 11, iso: 200, sources: { fNumber: 'typed' } });
		expect(typed.predicted.offsetStops).not.toBeNull();
		const cleared = await updateShot(studio.people.editor.user, setupId, id, { typed: { iso: null } });
		expect(cleared.settings.sources.iso).toBe('not recorded');
		await expect(updateShot(studio.people.editor.user, setupId, id, { revisionNumber: 9 })).rejects.toMatchObject({ field: 'revisionNumber' });
		await trashShot(studio.people.editor.user, setupId, id);
		await expect(getShot(studio.people.viewer.user, setupId, id)).rejects.toMatchObject({ status: 404 });
		expect((await listShots(studio.people.viewer.user, setupId, { trashed: true })).shots.map((s) => s.id)).toContain(id);
		await restoreShot(studio.people.editor.user, setupId, id);
		expect((await getShot(studio.people.viewer.user, setupId, id)).deletedAt).toBeNull();
	});
});

describe('predicted against actual', () => {
	it('measures uniform sRGB 118 grey at the predicted settings as about 0 stops (IEC 61966-2-1: 18 % ≈ 118)', async () => {
		// The aperture at which the plan predicts a mid-grey exposure at 1/125 s, ISO 100.
		const scene = exposureSceneSchema.parse(sampleDocument().scene);
		const at16 = computeExposure({ ...scene, camera: { ...scene.camera, aperture: 16, shutter: 1 / 125, iso: 100 } }).total.exposureOffsetStops!;
		const aperture = 16 * 2 ** (at16 / 2);
		const exif = { ...SAMPLE_EXIF, FNumber: `${Math.round(aperture * 1000)}/1000` };
		const { created } = await uploadShots(studio.people.editor.user, setupId, [file('grey.jpg', await testImage({ grey: 118, exif }))]);
		expect(created[0].predicted.offsetStops).toBeCloseTo(0, 2);
		const measured = await measureShot(studio.people.editor.user, setupId, created[0].id, { method: 'region', region: { x: 0.25, y: 0.25, width: 0.5, height: 0.5 } });
		expect(measured.actual?.offsetStops).toBeCloseTo(0, 1);
		expect(Math.abs(measured.differenceStops!)).toBeLessThan(0.05);
	});

	it('takes a meter reading instead: f/16 asked for a shot made at f/11.3 is one stop over', async () => {
		const { created } = await uploadShots(studio.people.editor.user, setupId, [file('metered.jpg', await testImage({ exif: { ...SAMPLE_EXIF, FNumber: '11314/1000' } }))]);
		const measured = await measureShot(studio.people.editor.user, setupId, created[0].id, { method: 'meter', meter: { aperture: 16 } });
		expect(measured.actual).toMatchObject({ method: 'meter' });
		expect(measured.actual!.offsetStops).toBeCloseTo(1, 3);
	});
});

describe('flash calibration', () => {
	it('from a shot 2/3 stop under: GN × 2^(−1/3) on the shelf, used by saves from then on, not by older revisions; undoable', async () => {
		const editor = studio.people.editor.user;
		const flash = await createGear(editor, gearCreateSchema.parse({ studioId: studio.studioId, kind: 'flash', name: 'Kestrel 40 speedlight', spec: { guideNumberM: 40, lowestPower: 1 / 128, syncSpeedS: 1 / 200 } }));
		// A flash-only plan (no reflector), so the flash gives all of the light.
		const doc = sampleDocument({ plan: { elements: { key: { kind: 'flash', gearId: flash.id } } } });
		doc.scene.lights = doc.scene.lights.filter((l) => l.id === 'key');
		const setup = await createSetup(editor, setupCreateSchema.parse({ studioId: studio.studioId, title: 'Ammonite section', subject: 'ammonite', document: doc }));
		const before = (await setupExposure(editor, setup.id)).total.exposureOffsetStops!;
		// A shot at the plan's own settings whose grey measures 2/3 stop under the prediction.
		const { created } = await uploadShots(editor, setup.id, [file('test-shot.png', await testImage({ format: 'png', exif: { FNumber: '16/1', ExposureTime: '1/200', ISOSpeedRatings: '100' } }))]);
		const shot = created[0];
		expect(shot.predicted.offsetStops).toBeCloseTo(before, 9);
		// PNG pixels are exact; a uniform grey of the code nearest 2/3 stop under the prediction.
		const code = codeFor(before - 2 / 3);
		const { created: greyShots } = await uploadShots(editor, setup.id, [file('grey-under.png', await testImage({ format: 'png', grey: code, exif: { FNumber: '16/1', ExposureTime: '1/200', ISOSpeedRatings: '100' } }))]);
		const measured = await measureShot(editor, setup.id, greyShots[0].id, { method: 'region', region: { x: 0, y: 0, width: 1, height: 1 } });
		const difference = measured.differenceStops!;
		expect(difference).toBeCloseTo(-2 / 3, 1);
		const { calibration, warnings } = await calibrateFlash(editor, setup.id, calibrationSchema.parse({ method: 'shot', gearId: flash.id, shotId: greyShots[0].id }));
		expect(warnings).toEqual([]);
		expect(calibration.guideNumberM).toBeCloseTo(40 * 2 ** (difference / 2), 9);
		expect(calibration.offsetStops).toBeCloseTo(difference, 9);
		// It is the flash's one offset on the shelf; the guide number stays the rated one.
		expect((await getGear(editor, flash.id)).spec).toMatchObject({ guideNumberM: 40, calibrationOffsetStops: expect.closeTo(difference, 9) });
		// Revision 1 keeps its copy; a new save predicts with the calibrated flash.
		expect((await setupExposure(editor, setup.id, 1)).total.exposureOffsetStops).toBeCloseTo(before, 9);
		const current = await getSetup(editor, setup.id);
		const saved = await saveSetup(editor, setup.id, setupSaveSchema.parse({ baseRevision: current.revisionNumber, document: doc, message: 'after calibrating' }));
		const after = (await setupExposure(editor, setup.id, saved.revisionNumber)).total.exposureOffsetStops!;
		expect(after - before).toBeCloseTo(difference, 9);
		expect((await setupExposure(editor, setup.id, 1)).total.exposureOffsetStops).toBeCloseTo(before, 9);
		// Viewers see the history; undoing puts the rated guide number back for the next save.
		const history = await listCalibrations(studio.people.viewer.user, flash.id);
		expect(history.calibrations[0]).toMatchObject({ id: calibration.id, active: true, method: 'shot' });
		await expect(undoCalibration(studio.people.viewer.user, flash.id, calibration.id)).rejects.toMatchObject({ status: 403 });
		const undone = await undoCalibration(editor, flash.id, calibration.id);
		expect(undone.calibrations[0]).toMatchObject({ active: false, undoneAt: expect.any(String) });
		expect((await getGear(editor, flash.id)).spec).toMatchObject({ calibrationOffsetStops: 0 });
		const third = await saveSetup(editor, setup.id, setupSaveSchema.parse({ baseRevision: saved.revisionNumber, document: doc, message: 'after undoing' }));
		expect((await setupExposure(editor, setup.id, third.revisionNumber)).total.exposureOffsetStops).toBeCloseTo(before, 9);
		expect((await setupExposure(editor, setup.id, saved.revisionNumber)).total.exposureOffsetStops).toBeCloseTo(after, 9);
	});

	it('from a flash-meter reading (GN = N·d / (√(ISO/100)·√power·2^(−loss/2))), and warns when the flash is not most of the light', async () => {
		const editor = studio.people.editor.user;
		const flash = await createGear(editor, gearCreateSchema.parse({ studioId: studio.studioId, kind: 'flash', name: 'Wren 32', spec: { guideNumberM: 32, lowestPower: 1 / 64, syncSpeedS: 1 / 250 } }));
		const { calibration } = await calibrateFlash(editor, setupId, calibrationSchema.parse({ method: 'meter', gearId: flash.id, aperture: 11, distanceM: 1, iso: 100, power: 0.25, lossStops: 1 }));
		expect(calibration.guideNumberM).toBeCloseTo((11 * 1) / (1 * 0.5 * 2 ** -0.5), 9);
		expect(calibration.ratedGuideNumberM).toBe(32);
		await expect(
			calibrateFlash(studio.people.viewer.user, setupId, calibrationSchema.parse({ method: 'meter', gearId: flash.id, aperture: 11, distanceM: 1, iso: 100, power: 1 }))
		).rejects.toMatchObject({ status: 403 });
		// A reading that would put the flash more than 5 stops from its label is refused, naming the field.
		await expect(
			calibrateFlash(editor, setupId, calibrationSchema.parse({ method: 'meter', gearId: flash.id, aperture: 1, distanceM: 0.1, iso: 100, power: 1 }))
		).rejects.toMatchObject({ status: 400, field: 'aperture' });
	});

	it('an offset typed on the gear form is in the history too: undoing a later calibration returns to it', async () => {
		const editor = studio.people.editor.user;
		const flash = await createGear(editor, gearCreateSchema.parse({ studioId: studio.studioId, kind: 'flash', name: 'Marten 24', spec: { guideNumberM: 24, lowestPower: 1 / 128, syncSpeedS: 1 / 200, calibrationOffsetStops: -0.3 } }));
		await updateGear(editor, flash.id, { spec: { guideNumberM: 24, lowestPower: 1 / 128, syncSpeedS: 1 / 200, calibrationOffsetStops: -0.7 } });
		// A change of name alone records nothing.
		await updateGear(editor, flash.id, { name: 'Marten 24 (club)' });
		const { calibration } = await calibrateFlash(editor, setupId, calibrationSchema.parse({ method: 'meter', gearId: flash.id, aperture: 12, distanceM: 2, iso: 100, power: 1 }));
		// f/12 at 2 m is GN 24, the label's figure: 0 stops.
		expect((await getGear(editor, flash.id)).spec.calibrationOffsetStops).toBeCloseTo(0, 9);
		const history = await listCalibrations(editor, flash.id);
		expect(history.calibrations.map((c) => [c.method, Math.round(c.offsetStops * 10) / 10, c.active])).toEqual([
			['meter', 0, true],
			['typed', -0.7, false],
			['typed', -0.3, false]
		]);
		await undoCalibration(editor, flash.id, calibration.id);
		expect((await getGear(editor, flash.id)).spec.calibrationOffsetStops).toBe(-0.7);
	});
});

afterAll(() => useObjectStore(null));
