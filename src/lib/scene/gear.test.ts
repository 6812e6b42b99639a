import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema } from '$lib/light/schema';
import { flashSpecSchema, gearCreateSchema, gearSpecSchemas, gearUpdateSchema, guideNumberAtZoom, parseGearSpec, sceneFlashFromShelf } from './gear';

const valid = {
	flash: { guideNumberM: 40, lowestPower: 1 / 256, syncSpeedS: 1 / 250, calibrationOffsetStops: -0.3 },
	modifier: { shape: 'softbox', lossStops: 1.7, beamAngleDeg: 90 },
	reflector: { widthM: 0.2, heightM: 0.3, reflectance: 0.85, surface: 'diffuse' },
	lens: { focalLengthMm: 100, maxMagnification: 1, pupilMagnification: 0.8, widestAperture: 2.8, narrowestAperture: 32 },
	camera: { sensorWidthMm: 36, sensorHeightMm: 24, cocMm: 0.03, syncSpeedS: 1 / 200 }
} as const;

const fieldsOf = (r: ReturnType<typeof parseGearSpec>) => (r.ok ? [] : r.issues.map((i) => i.path.join('.')));

describe('gear specs', () => {
	it('accept a plausible item of each kind', () => {
		for (const [kind, spec] of Object.entries(valid)) {
			expect(gearSpecSchemas[kind as keyof typeof valid].safeParse(spec).success, kind).toBe(true);
		}
	});

	it('fill in defaults: no calibration measured yet is 0 stops, not mains powered', () => {
		const r = parseGearSpec('flash', { guideNumberM: 24, lowestPower: 1 / 128, syncSpeedS: 1 / 200 });
		expect(r.ok && r.spec).toMatchObject({ calibrationOffsetStops: 0, mainsPowered: false });
	});

	it('name the field at fault', () => {
		expect(fieldsOf(parseGearSpec('flash', { ...valid.flash, guideNumberM: 0 }))).toEqual(['spec.guideNumberM']);
		expect(fieldsOf(parseGearSpec('flash', { ...valid.flash, lowestPower: 2 }))).toEqual(['spec.lowestPower']);
		expect(fieldsOf(parseGearSpec('modifier', { ...valid.modifier, lossStops: -1 }))).toEqual(['spec.lossStops']);
		expect(fieldsOf(parseGearSpec('modifier', { ...valid.modifier, beamAngleDeg: 400 }))).toEqual(['spec.beamAngleDeg']);
		expect(fieldsOf(parseGearSpec('reflector', { ...valid.reflector, reflectance: 1.2 }))).toEqual(['spec.reflectance']);
		expect(fieldsOf(parseGearSpec('reflector', { ...valid.reflector, surface: 'shiny' }))).toEqual(['spec.surface']);
		expect(fieldsOf(parseGearSpec('lens', { ...valid.lens, widestAperture: 22, narrowestAperture: 16 }))).toEqual(['spec.narrowestAperture']);
		expect(fieldsOf(parseGearSpec('camera', { ...valid.camera, cocMm: 'small' }))).toEqual(['spec.cocMm']);
		expect(fieldsOf(parseGearSpec('camera', {}))).toEqual(['spec.sensorWidthMm', 'spec.sensorHeightMm', 'spec.cocMm', 'spec.syncSpeedS']);
	});
});

describe('gearCreateSchema', () => {
	it('checks the spec against the kind given', () => {
		const ok = gearCreateSchema.safeParse({ kind: 'reflector', name: ' Silver 30 cm ', spec: { widthM: 0.3, heightM: 0.3, reflectance: 0.8, surface: 'specular' } });
		expect(ok.success && ok.data.name).toBe('Silver 30 cm');
		const wrongKind = gearCreateSchema.safeParse({ kind: 'lens', name: 'Silver 30 cm', spec: valid.reflector });
		expect(wrongKind.success).toBe(false);
		expect(wrongKind.error?.issues.map((i) => i.path.join('.'))).toContain('spec.focalLengthMm');
		const unknown = gearCreateSchema.safeParse({ kind: 'tripod', name: 'x', spec: {} });
		expect(unknown.error?.issues.map((i) => i.path.join('.'))).toEqual(['kind']);
	});

	it('wants a change in an update', () => {
		expect(gearUpdateSchema.safeParse({}).success).toBe(false);
		expect(gearUpdateSchema.safeParse({ retired: true }).success).toBe(true);
	});
});

describe('a shelf flash in the scene (issue 15, item 7)', () => {
	const zoomHead = { ...valid.flash, guideNumberM: 40, guideNumbersByZoom: [{ zoomMm: 24, guideNumberM: 26 }, { zoomMm: 50, guideNumberM: 36 }, { zoomMm: 105, guideNumberM: 48 }] };

	it('an old stored spec, without zoom positions, stays valid', () => {
		expect(parseGearSpec('flash', { guideNumberM: 24, lowestPower: 1 / 128, syncSpeedS: 1 / 200 }).ok).toBe(true);
	});

	it('holds guide numbers per zoom position; the plan’s position picks one, between two the wider one', () => {
		// Common practice: a zoom head's guide number rises with its zoom setting; never promise the longer one.
		const spec = flashSpecSchema.parse(zoomHead);
		expect(guideNumberAtZoom(spec, 50)).toBe(36);
		expect(guideNumberAtZoom(spec, 70)).toBe(36);
		expect(guideNumberAtZoom(spec, 14)).toBe(40);
		expect(guideNumberAtZoom(spec)).toBe(40);
	});

	it('carries its calibration and lowest step into the scene’s flash, which the engine uses', () => {
		const light = { id: 'k', kind: 'flash' as const, position: [0.5, 0, 0] as [number, number, number], power: 1, ...sceneFlashFromShelf(flashSpecSchema.parse(zoomHead), 24) };
		expect(light).toMatchObject({ guideNumber: 26, calibrationOffsetStops: -0.3, lowestPower: 1 / 256, zoomMm: 24 });
		const r = computeExposure(exposureSceneSchema.parse({ camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0 }, subject: { position: [0, 0, 0] }, lights: [light] }));
		// GN 26 at 0.5 m and f/16: (26 / 8)² = 10.6, less 0.3 stop of calibration.
		expect(r.lights[0].stops).toBeCloseTo(2 * Math.log2(26 / 8) - 0.3, 10);
	});
});
