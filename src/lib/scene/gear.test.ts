import { describe, expect, it } from 'vitest';
import { gearCreateSchema, gearSpecSchemas, gearUpdateSchema, parseGearSpec } from './gear';

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
