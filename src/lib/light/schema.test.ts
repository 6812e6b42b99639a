import { describe, expect, it } from 'vitest';
import { ambientCalcSchema, colourCalcSchema, exposureSceneSchema, flashCalcSchema, opticsCalcSchema } from './schema';

const paths = (r: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) =>
	r.error?.issues.map((i) => i.path.join('.')) ?? [];

const scene = {
	camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 1 },
	subject: { position: [0, 0, 0] },
	lights: [{ id: 'key', kind: 'flash', position: [0.3, 0, 0.2], guideNumber: 24, power: 0.5 }]
};

describe('calc schemas', () => {
	it('flash: defaults filled, bad fields named', () => {
		expect(flashCalcSchema.parse({ guideNumber: 24, distance: 0.3 })).toEqual({ guideNumber: 24, distance: 0.3, iso: 100, power: 1, lossStops: 0, magnification: 0, pupilMagnification: 1 });
		expect(paths(flashCalcSchema.safeParse({ guideNumber: -1, distance: 0.3 }))).toEqual(['guideNumber']);
		expect(paths(flashCalcSchema.safeParse({ guideNumber: 24, distance: 0.3, power: 1.5 }))).toEqual(['power']);
		expect(paths(flashCalcSchema.safeParse({ guideNumber: 24, distance: -0.3 }))).toEqual(['distance']);
		expect(paths(flashCalcSchema.safeParse({ guideNumber: '24', distance: 0.3 }))).toEqual(['guideNumber']);
		expect(flashCalcSchema.safeParse({ guideNumber: Number.NaN, distance: 1 }).success).toBe(false);
		expect(flashCalcSchema.safeParse({ guideNumber: Infinity, distance: 1 }).success).toBe(false);
	});

	it('optics: magnification must be above 0, overlap below 1', () => {
		expect(paths(opticsCalcSchema.safeParse({ aperture: 16, magnification: 0 }))).toEqual(['magnification']);
		expect(paths(opticsCalcSchema.safeParse({ aperture: 16, magnification: 1, overlap: 1 }))).toEqual(['overlap']);
	});

	it('ambient: exactly one reading', () => {
		expect(paths(ambientCalcSchema.safeParse({ aperture: 8 }))).toEqual(['ev100']);
		expect(paths(ambientCalcSchema.safeParse({ aperture: 8, ev100: 12, illuminanceLux: 400 }))).toEqual(['illuminanceLux']);
		expect(ambientCalcSchema.parse({ aperture: 8, illuminanceLux: 400 }).calibrationC).toBe(250);
		expect(paths(ambientCalcSchema.safeParse({ aperture: 8, skyPreset: 'moonlight' }))).toEqual(['skyPreset']);
	});

	it('colour: the pairs go together; a gel cannot pass absolute zero', () => {
		expect(colourCalcSchema.safeParse({ fromKelvin: 3200, toKelvin: 5500 }).success).toBe(true);
		expect(paths(colourCalcSchema.safeParse({ fromKelvin: 3200 }))).toEqual(['toKelvin']);
		expect(paths(colourCalcSchema.safeParse({ kelvin: 3200 }))).toEqual(['gelMired']);
		expect(paths(colourCalcSchema.safeParse({}))).toEqual(['fromKelvin']);
		expect(paths(colourCalcSchema.safeParse({ kelvin: 20000, gelMired: -60 }))).toEqual(['gelMired']);
	});
});

describe('exposure scene schema', () => {
	it('accepts a plain scene', () => {
		expect(exposureSceneSchema.safeParse(scene).success).toBe(true);
	});

	it('names an unknown kind', () => {
		const r = exposureSceneSchema.safeParse({ ...scene, lights: [{ ...scene.lights[0], kind: 'laser' }] });
		expect(paths(r)).toEqual(['lights.0.kind']);
	});

	it('refuses more than 100 lights or flags', () => {
		const many = Array.from({ length: 101 }, (_, i) => ({ ...scene.lights[0], id: `l${i}` }));
		expect(paths(exposureSceneSchema.safeParse({ ...scene, lights: many }))).toEqual(['lights']);
		const flags = Array.from({ length: 101 }, (_, i) => ({ id: `f${i}`, from: [0, 1], to: [1, 1] }));
		expect(paths(exposureSceneSchema.safeParse({ ...scene, flags }))).toEqual(['flags']);
	});

	it('duplicate ids, reserved "ambient", dangling sources, a light at the subject', () => {
		const r = exposureSceneSchema.safeParse({
			...scene,
			lights: [
				scene.lights[0],
				{ ...scene.lights[0] },
				{ ...scene.lights[0], id: 'ambient' },
				{ id: 'card', kind: 'reflector', position: [0, 1, 0], areaM2: 0.1, reflectance: 0.9, surface: 'diffuse', source: 'nobody' },
				{ id: 'card2', kind: 'reflector', position: [0, 1, 0], areaM2: 0.1, reflectance: 0.9, surface: 'diffuse', source: 'card' },
				{ id: 'card3', kind: 'reflector', position: [0, 1, 0], areaM2: 0.1, reflectance: 0.9, surface: 'diffuse', source: 'ambient' },
				{ ...scene.lights[0], id: 'here', position: [0, 0, 0] }
			]
		});
		expect(paths(r).sort()).toEqual(['lights.1.id', 'lights.2.id', 'lights.3.source', 'lights.4.source', 'lights.5.source', 'lights.6.position'].sort());
	});

	it('negative reflectance, unknown surface, a zero-length flag, a bad tuple', () => {
		const r = exposureSceneSchema.safeParse({
			...scene,
			lights: [...scene.lights, { id: 'card', kind: 'reflector', position: [0, 1, 0], areaM2: 0.1, reflectance: -1, surface: 'glossy', source: 'key' }],
			flags: [{ id: 'g', from: [1, 1], to: [1, 1] }],
			subject: { position: [0, 0] }
		});
		expect(paths(r).sort()).toEqual(['lights.1.reflectance', 'lights.1.surface', 'subject.position'].sort());
	});
});
