import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema } from '$lib/light/schema';
import { migrateDocument } from '$lib/scene/migrations';
import { DEMO_SETUPS } from '$lib/server/seed/notebook-data';
import { liveExposure } from './live-exposure';
import { modelFromDocument } from './model/document';
import { toExposureScene } from './model/scene';

const scene = exposureSceneSchema.parse({
	camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0.5 },
	subject: { position: [0, 0, 0.02] },
	lights: [{ id: 'key', kind: 'flash', position: [-0.3, 0, 0.2], guideNumber: 24, power: 0.25 }]
});

describe('live exposure', () => {
	it('is the engine’s answer for a valid scene', () => {
		expect(liveExposure(scene)).toEqual({ ok: true, result: computeExposure(scene) });
	});

	it('names the field at fault, as the API would, instead of computing', () => {
		const atSubject = { ...scene, lights: [{ ...scene.lights[0], position: [0, 0, 0.02] as [number, number, number] }] };
		expect(liveExposure(atSubject)).toEqual({ ok: false, message: 'lights.0.position: is at the subject (closer than 1 mm)' });
		expect(exposureSceneSchema.safeParse(atSubject).error?.issues[0]).toMatchObject({ path: ['lights', 0, 'position'], message: 'is at the subject (closer than 1 mm)' });
	});

	// The live exposure runs no schema: the scene the editor builds from the elements it read must be one
	// the API's schema takes as it is, so the live answer is the API's.
	it('on every seeded revision, the editor’s scene passes the API’s schema unchanged and the live answer is the API’s', () => {
		for (const s of DEMO_SETUPS) {
			s.revisions.forEach((r, i) => {
				const read = migrateDocument(structuredClone(r.document));
				if (!read.ok) throw new Error(read.message);
				const built = toExposureScene(modelFromDocument(read.document).model);
				const parsed = exposureSceneSchema.safeParse(built);
				expect(parsed.success, `${s.title} r${i + 1}`).toBe(true);
				expect(parsed.data, `${s.title} r${i + 1}`).toEqual(built);
				expect(liveExposure(built), `${s.title} r${i + 1}`).toEqual({ ok: true, result: computeExposure(parsed.data!) });
			});
		}
	});
});
