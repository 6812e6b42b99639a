import { describe, expect, it } from 'vitest';
import { kelvinToHex as editorHex } from '$lib/editor/kelvin-colour';
import { DEFAULT_FLASH_KELVIN, kelvinToHex, kelvinToRgb, kelvinToStroke } from './kelvin';

const rgbOf = (hex: string) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));

describe('notebook drawing colours', () => {
	it('fill a light with the same colour the plan editor draws it in', () => {
		for (const k of [2000, 3200, 5500, 6500, 9000]) expect(kelvinToHex(k)).toBe(editorHex(k));
	});

	it('draw a light of unknown temperature as a flash', () => {
		expect(kelvinToHex(Number.NaN)).toBe(editorHex(DEFAULT_FLASH_KELVIN));
	});

	it('run from warm to cool: tungsten is redder than blue, north sky bluer than red (fill and stroke)', () => {
		const [r3, , b3] = kelvinToRgb(3200);
		const [r9, , b9] = kelvinToRgb(9000);
		expect(r3).toBeGreaterThan(b3);
		expect(b9).toBeGreaterThan(r9);
		const [sr3, , sb3] = rgbOf(kelvinToStroke(3200));
		const [sr9, , sb9] = rgbOf(kelvinToStroke(9000));
		expect(sr3).toBeGreaterThan(sb3);
		expect(sb9).toBeGreaterThan(sr9);
	});

	it('keep strokes dark enough to show on white paper (no channel mix brighter than mid-grey)', () => {
		for (const k of [1500, 2400, 3200, 4300, 5500, 6500, 8000, 12000]) {
			const [r, g, b] = rgbOf(kelvinToStroke(k));
			expect((r + g + b) / 3).toBeLessThan(160);
		}
	});
});
