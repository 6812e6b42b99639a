import { describe, expect, it } from 'vitest';
import { kelvinToHex, kelvinToRgb, planckianXy } from './kelvin-colour';

/**
 * Planck's law integrated against the CIE 1931 colour-matching functions, these approximated by the
 * multi-lobe Gaussian fit of C. Wyman, P.-P. Sloan and P. Shirley, "Simple Analytic Approximations to
 * the CIE XYZ Color Matching Functions", Journal of Computer Graphics Techniques 2(2), 2013 (coefficients
 * from memory). An independent route to the locus, to check the spline against.
 */
function blackbodyXy(kelvin: number): [number, number] {
	const g = (l: number, mu: number, s1: number, s2: number) => Math.exp(-0.5 * ((l - mu) / (l < mu ? s1 : s2)) ** 2);
	const c2 = 1.4387769e-2; // m·K, second radiation constant (CODATA 2018)
	let X = 0;
	let Y = 0;
	let Z = 0;
	for (let nm = 360; nm <= 830; nm++) {
		const l = nm * 1e-9;
		const planck = 1 / (l ** 5 * (Math.exp(c2 / (l * kelvin)) - 1));
		X += planck * (1.056 * g(nm, 599.8, 37.9, 31.0) + 0.362 * g(nm, 442.0, 16.0, 26.7) - 0.065 * g(nm, 501.1, 20.4, 26.2));
		Y += planck * (0.821 * g(nm, 568.8, 46.9, 40.5) + 0.286 * g(nm, 530.9, 16.3, 31.1));
		Z += planck * (1.217 * g(nm, 437.0, 11.8, 36.0) + 0.681 * g(nm, 459.0, 26.0, 13.8));
	}
	return [X / (X + Y + Z), Y / (X + Y + Z)];
}

describe('kelvin colour', () => {
	it('CIE illuminant A (a Planckian radiator at 2856 K) sits at x = 0.44757, y = 0.40745', () => {
		// CIE 15:2004 Colorimetry, table of the standard illuminants' chromaticities (from memory).
		const [x, y] = planckianXy(2856);
		expect(x).toBeCloseTo(0.44757, 3);
		expect(y).toBeCloseTo(0.40745, 3);
	});

	it('follows Planck’s law across the range the plan uses', () => {
		for (const k of [2000, 2700, 3200, 4000, 5000, 5600, 6500, 8000, 10000]) {
			const [x, y] = planckianXy(k);
			const [bx, by] = blackbodyXy(k);
			expect(Math.hypot(x - bx, y - by)).toBeLessThan(0.004);
		}
	});

	it('is near white at 6500 K, orange for tungsten, blue for open shade', () => {
		const [r65, g65, b65] = kelvinToRgb(6500);
		expect(Math.min(r65, g65, b65)).toBeGreaterThan(240);
		const [r, g, b] = kelvinToRgb(3200);
		expect(r).toBe(255);
		expect(g).toBeGreaterThan(b);
		expect(b).toBeLessThan(160);
		const blue = kelvinToRgb(10000);
		expect(blue[2]).toBe(255);
		expect(blue[0]).toBeLessThan(blue[2]);
	});

	it('warms steadily as the kelvin falls', () => {
		let lastBlue = 256;
		for (const k of [12000, 8000, 6500, 5500, 4500, 3200, 2500, 1900]) {
			const b = kelvinToRgb(k)[2];
			expect(b).toBeLessThanOrEqual(lastBlue);
			lastBlue = b;
		}
	});

	it('clamps outside the spline’s range and writes hex', () => {
		expect(kelvinToRgb(1000)).toEqual(kelvinToRgb(1667));
		expect(kelvinToRgb(40000)).toEqual(kelvinToRgb(25000));
		expect(kelvinToHex(6500)).toMatch(/^#[0-9a-f]{6}$/);
	});
});
