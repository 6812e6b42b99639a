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
