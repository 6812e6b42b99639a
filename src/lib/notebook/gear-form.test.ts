import { describe, expect, it } from 'vitest';
import { cellText, fieldText, GEAR_FIELDS, specFromForm } from './gear-form';

function form(entries: Record<string, string>) {
	const f = new FormData();
	for (const [k, v] of Object.entries(entries)) f.set(k, v);
	return f;
}

describe('specFromForm', () => {
	it('reads a flash as people write it', () => {
		const r = specFromForm('flash', form({ 'spec.guideNumberM': '40', 'spec.lowestPower': '1/128', 'spec.syncSpeedS': '1/250', 'spec.calibrationOffsetStops': '-0.3' }));
		expect(r.errors).toEqual({});
		expect(r.spec).toEqual({ guideNumberM: 40, lowestPower: 1 / 128, syncSpeedS: 1 / 250, calibrationOffsetStops: -0.3, mainsPowered: false });
	});

	it('reads the guide numbers by zoom as people write them, and names a position it cannot read', () => {
		const r = specFromForm('flash', form({ 'spec.guideNumberM': '40', 'spec.lowestPower': '1/128', 'spec.syncSpeedS': '1/250', 'spec.guideNumbersByZoom': '24 mm: 28, 35mm:40;\n105 mm : 58' }));
		expect(r.errors).toEqual({});
		expect(r.spec.guideNumbersByZoom).toEqual([
			{ zoomMm: 24, guideNumberM: 28 },
			{ zoomMm: 35, guideNumberM: 40 },
			{ zoomMm: 105, guideNumberM: 58 }
		]);
		const bad = specFromForm('flash', form({ 'spec.guideNumberM': '40', 'spec.lowestPower': '1/128', 'spec.syncSpeedS': '1/250', 'spec.guideNumbersByZoom': '24 mm: 28, wide' }));
		expect(bad.errors['spec.guideNumbersByZoom']).toMatch(/“wide”.*35 mm: 40/);
	});

	it('a flash edited through its form keeps its guide numbers by zoom and a camera its pixel pitch', () => {
		// The edit form is filled from the stored spec (fieldText), so what the person does not touch goes back unchanged.
		const stored: Record<string, unknown> = {
			guideNumberM: 40,
			lowestPower: 1 / 128,
			syncSpeedS: 1 / 250,
			calibrationOffsetStops: 0,
			zoomMm: 35,
			guideNumbersByZoom: [
				{ zoomMm: 24, guideNumberM: 28 },
				{ zoomMm: 35, guideNumberM: 40 },
				{ zoomMm: 105, guideNumberM: 58 }
			],
			mainsPowered: false
		};
		const filled = (kind: 'flash' | 'camera', spec: Record<string, unknown>) =>
			form(Object.fromEntries(GEAR_FIELDS[kind].map((f) => [`spec.${f.key}`, fieldText(f, spec[f.key])])));
		expect(specFromForm('flash', filled('flash', stored)).spec).toEqual(stored);
		const camera = { sensorWidthMm: 23.5, sensorHeightMm: 15.6, cocMm: 0.02, pixelPitchUm: 3.9, syncSpeedS: 1 / 200 };
		expect(specFromForm('camera', filled('camera', camera)).spec).toEqual(camera);
	});

	it('reads a reflector in centimetres or inches and a reflectance in per cent', () => {
		const r = specFromForm('reflector', form({ 'spec.widthM': '30', 'spec.heightM': '8 in', 'spec.reflectance': '85 %', 'spec.surface': 'diffuse' }));
		expect(r.errors).toEqual({});
		// 8 in = 0.2032 m: the inch is exactly 25.4 mm (international yard and pound, 1959).
		expect(r.spec.widthM).toBeCloseTo(0.3, 12);
		expect(r.spec.heightM).toBeCloseTo(0.2032, 12);
		expect(r.spec.reflectance).toBeCloseTo(0.85, 12);
	});

	it('names every field it cannot read or that is missing', () => {
		const r = specFromForm('lens', form({ 'spec.focalLengthMm': 'long', 'spec.widestAperture': 'f/2.8', 'spec.narrowestAperture': '' }));
		expect(Object.keys(r.errors).sort()).toEqual(['spec.focalLengthMm', 'spec.maxMagnification', 'spec.narrowestAperture']);
		expect(r.errors['spec.narrowestAperture']).toBe('is needed');
	});
});

describe('fieldText and cellText', () => {
	const flash = GEAR_FIELDS.flash;
	const by = (key: string) => flash.find((f) => f.key === key)!;
	it('writes values back the way they are typed', () => {
		expect(fieldText(by('lowestPower'), 1 / 128)).toBe('1/128');
		expect(fieldText(by('syncSpeedS'), 1 / 250)).toBe('1/250');
		expect(cellText(by('calibrationOffsetStops'), -0.3)).toBe('−0.3 stops');
		expect(cellText(by('mainsPowered'), false)).toBe('no');
	});
});
