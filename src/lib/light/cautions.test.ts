import { describe, expect, it } from 'vitest';
import { HOT_LIGHT_CLEARANCE_M, LIVING_SUBJECT_FLASH_DISTANCE_M, sceneCautions } from './cautions';
import { exposureSceneSchema, type ExposureSceneInput } from './schema';

const base: ExposureSceneInput = {
	camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 1 },
	subject: { position: [0, 0, 0] },
	lights: []
};
const codes = (s: ExposureSceneInput) => sceneCautions(exposureSceneSchema.parse(s)).map((c) => c.code);

describe('cautions', () => {
	it('a hot lamp within the clearance of a flag is cautioned; beyond it is not', () => {
		const lamp = { id: 'lamp', kind: 'continuous' as const, position: [1, 0, 0.5] as [number, number, number], luxAt1m: 500 };
		const near = { id: 'black', from: [1, HOT_LIGHT_CLEARANCE_M - 0.1] as [number, number], to: [2, HOT_LIGHT_CLEARANCE_M - 0.1] as [number, number] };
		const far = { id: 'black', from: [1, HOT_LIGHT_CLEARANCE_M + 0.1] as [number, number], to: [2, HOT_LIGHT_CLEARANCE_M + 0.1] as [number, number] };
		expect(codes({ ...base, lights: [lamp], flags: [near] })).toEqual(['hot-light-near-material']);
		expect(codes({ ...base, lights: [lamp], flags: [far] })).toEqual([]);
	});

	it('a flash near a living subject, only when the subject is living and close', () => {
		const flash = (d: number) => ({ id: 'f', kind: 'flash' as const, position: [d, 0, 0] as [number, number, number], guideNumber: 20, power: 1 });
		expect(codes({ ...base, subject: { position: [0, 0, 0], living: true }, lights: [flash(LIVING_SUBJECT_FLASH_DISTANCE_M - 0.1)] })).toEqual(['flash-near-living-subject']);
		expect(codes({ ...base, subject: { position: [0, 0, 0], living: true }, lights: [flash(LIVING_SUBJECT_FLASH_DISTANCE_M + 0.1)] })).toEqual([]);
		expect(codes({ ...base, lights: [flash(0.1)] })).toEqual([]);
	});

	it('every caution defers to manuals or local rules', () => {
		const all = sceneCautions(
			exposureSceneSchema.parse({
				...base,
				camera: { ...base.camera, centreColumn: 'extended' },
				subject: { position: [0, 0, 0], living: true },
				ambient: { ev100: 15 },
				lights: [
					{ id: 'lamp', kind: 'continuous', position: [1, 0, 0], luxAt1m: 500, gelMired: 50 },
					{ id: 'silver', kind: 'reflector', position: [1.1, 0, 0], areaM2: 0.2, reflectance: 0.8, surface: 'specular', source: 'ambient' },
					{ id: 'f', kind: 'flash', position: [0.2, 0, 0], guideNumber: 20, power: 1, mainsPowered: true }
				]
			})
		);
		expect(all).toHaveLength(6);
		for (const c of all) expect(c.message).toMatch(/manual|local/);
	});
});

describe('cautions the trade expects (issue 15, item 11)', () => {
	it('a hot lamp near a live insect, a small flash through a gel, a close-up lens in sun, a reversed column', () => {
		// Common practice: each is a usual caution in close-up work; the thresholds are ours (cautions.ts).
		const found = codes({
			...base,
			camera: { ...base.camera, centreColumn: 'reversed', magnificationBy: 'close-up-lens' },
			subject: { position: [0, 0, 0], living: true },
			ambient: { ev100: 15 },
			lights: [
				{ id: 'lamp', kind: 'continuous', position: [0.3, 0, 0.2], luxAt1m: 500 },
				{ id: 'small', kind: 'flash', position: [-0.8, 0, 0.3], guideNumber: 20, power: 0.5, gelMired: 159 }
			]
		});
		expect(found.sort()).toEqual(['close-up-lens-sun', 'flash-head-overheating', 'hot-light-living-subject', 'reversed-centre-column']);
	});

	it('the reversed column caution speaks of off-centre load and a leg, not a top-heavy tripod', () => {
		const [c] = sceneCautions(exposureSceneSchema.parse({ ...base, camera: { ...base.camera, centreColumn: 'reversed' } }));
		expect(c.message).toMatch(/between the legs/);
		expect(c.message).not.toMatch(/top-heavy/);
	});

	it('a mains strobe’s caution names its modelling lamp and a licensed electrician', () => {
		const [c] = sceneCautions(exposureSceneSchema.parse({ ...base, lights: [{ id: 's', kind: 'flash', position: [1, 0, 0], guideNumber: 40, power: 1, mainsPowered: true }] }));
		expect(c.message).toMatch(/modelling lamp/);
		expect(c.message).toMatch(/licensed electrician/);
	});
});
