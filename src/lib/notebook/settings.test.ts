import { describe, expect, it } from 'vitest';
import { parseCameraSettings, parseMagnification, parseTags } from './settings';

describe('parseCameraSettings', () => {
	it('reads what photographers type', () => {
		const r = parseCameraSettings({ iso: '200', aperture: 'f/16', shutter: '1/125', magnification: '1:2' });
		expect(r).toEqual({ ok: true, value: { iso: 200, aperture: 16, shutter: 1 / 125, magnification: 0.5 } });
	});

	it('names each field that is wrong', () => {
		const r = parseCameraSettings({ iso: '', aperture: 'f/0.1', shutter: '2 m', magnification: 'huge' });
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.errors.iso).toBe('ISO is empty.');
		expect(r.errors.aperture).toBe('Aperture must be at least 0.5.');
		expect(r.errors.shutter).toBe('Shutter speed needs a time (for example 1/125 or 2 s).');
		expect(r.errors.magnification).toMatch(/^Magnification /);
	});

	it('a negative magnification is refused, not clamped', () => {
		const r = parseCameraSettings({ iso: '100', aperture: '11', shutter: '1/200', magnification: '-1' });
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.errors.magnification).toBe('Magnification must be at least 0.');
	});
});

describe('parseMagnification', () => {
	it('life-size written four ways', () => {
		for (const t of ['1', '1x', '1:1', '1 ×']) expect(parseMagnification(t)).toBe(1);
		expect(parseMagnification('2:1')).toBe(2);
		expect(parseMagnification('1/4')).toBe(0.25);
	});
});

describe('parseTags', () => {
	it('splits, trims, lower-cases and removes repeats', () => {
		expect(parseTags(' Quartz, velvet ,quartz,, ')).toEqual(['quartz', 'velvet']);
	});
});
