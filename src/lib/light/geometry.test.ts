import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	angleBetweenDeg,
	beamExponent,
	beamFactor,
	beamFactorFromCosine,
	distanceM,
	facingCosine,
	illuminanceLux,
	inverseSquareStops,
	pointSegmentDistanceM,
	segmentsIntersect
} from './geometry';

describe('inverse-square and cosine laws', () => {
	it('1 cd at 1 m gives 1 lux', () => {
		// Source: definition of the lux, 1 lx = 1 cd·sr/m² (SI Brochure, BIPM, derived units; from memory).
		expect(illuminanceLux(1, 1)).toBe(1);
	});

	it('doubling the distance quarters the illuminance', () => {
		// Source: inverse-square law E = I/d² (Hecht, Optics, §3.3 photometry; IES Lighting Handbook; from memory).
		expect(illuminanceLux(100, 2) / illuminanceLux(100, 1)).toBe(0.25);
	});

	it('from 30 cm to 60 cm costs two stops; 30 cm to 42.4 cm one stop', () => {
		// Source: inverse-square law (as above) with one stop = a factor 2.
		expect(inverseSquareStops(0.3, 0.6)).toBeCloseTo(-2, 12);
		expect(inverseSquareStops(0.3, 0.3 * Math.SQRT2)).toBeCloseTo(-1, 12);
	});

	it('a surface tilted 60° from the light gets half the illuminance', () => {
		// Source: Lambert's cosine law E = I·cos θ / d² (Hecht, Optics, §3.3; from memory); cos 60° = 0.5.
		expect(illuminanceLux(100, 1, 60)).toBeCloseTo(50, 12);
	});

	it('a surface edge-on or facing away gets nothing', () => {
		// Source: Lambert's cosine law, as above.
		expect(illuminanceLux(100, 1, 90)).toBeCloseTo(0, 12);
		expect(illuminanceLux(100, 1, 120)).toBe(0);
	});

	it('3-D distance: a light 30 cm across and 40 cm up is 50 cm away', () => {
		expect(distanceM([0.3, 0, 0.4], [0, 0, 0])).toBeCloseTo(0.5, 12);
	});

	it('facing cosine clamps to 0 behind', () => {
		expect(facingCosine([0, 0, 1], [0, 0, 1])).toBe(1);
		expect(facingCosine([0, 0, 1], [1, 0, 1])).toBeCloseTo(Math.SQRT1_2, 12);
		expect(facingCosine([0, 0, 1], [0, 0, -1])).toBe(0);
	});

	it('property: doubling any distance costs two stops', () => {
		fc.assert(
			fc.property(fc.double({ min: 1e-3, max: 1e4, noNaN: true }), fc.double({ min: 1e-3, max: 1e6, noNaN: true }), (d, i) => {
				expect(Math.log2(illuminanceLux(i, 2 * d) / illuminanceLux(i, d))).toBeCloseTo(-2, 9);
			})
		);
	});
});

describe('beam falloff (our model)', () => {
	it('on the axis the beam gives full output; at half the beam angle it gives half', () => {
		expect(beamFactor(0, 60)).toBe(1);
		expect(beamFactor(30, 60)).toBeCloseTo(0.5, 12);
		expect(beamFactor(45, 90)).toBeCloseTo(0.5, 12);
	});

	it('from the cosine and the exponent it is the same factor (our model)', () => {
		for (const [deg, beam] of [[0, 60], [30, 60], [45, 90], [80, 40], [89.9, 120]]) {
			expect(beamFactorFromCosine(Math.cos((deg * Math.PI) / 180), beamExponent(beam))).toBeCloseTo(beamFactor(deg, beam), 12);
		}
		expect(beamFactorFromCosine(-0.2, 1)).toBe(0);
		expect(beamFactorFromCosine(1 + 1e-15, 3)).toBe(1);
	});

	it('a 180° beam is Lambertian (cos θ)', () => {
		expect(beamExponent(180)).toBe(1);
		expect(beamFactor(60, 180)).toBeCloseTo(0.5, 12);
	});

	it('nothing behind the light', () => {
		expect(beamFactor(90, 120)).toBe(0);
		expect(beamFactor(135, 120)).toBe(0);
	});

	it('angle between directions', () => {
		expect(angleBetweenDeg([1, 0, 0], [0, 1, 0])).toBeCloseTo(90, 12);
		expect(angleBetweenDeg([1, 0, 0], [1, 1, 0])).toBeCloseTo(45, 12);
	});
});

describe('flags in plan: segment intersection', () => {
	it('a flag across the path blocks it', () => {
		expect(segmentsIntersect([0, 0], [2, 0], [1, -1], [1, 1])).toBe(true);
	});

	it('a flag beside the path does not', () => {
		expect(segmentsIntersect([0, 0], [2, 0], [1, 0.1], [1, 1])).toBe(false);
		expect(segmentsIntersect([0, 0], [2, 0], [3, -1], [3, 1])).toBe(false);
	});

	it('touching the path counts as blocking; collinear overlap too', () => {
		expect(segmentsIntersect([0, 0], [2, 0], [1, 0], [1, 1])).toBe(true);
		expect(segmentsIntersect([0, 0], [2, 0], [1, 0], [3, 0])).toBe(true);
		expect(segmentsIntersect([0, 0], [2, 0], [2.5, 0], [3, 0])).toBe(false);
	});

	it('point-to-segment distance', () => {
		expect(pointSegmentDistanceM([1, 1], [0, 0], [2, 0])).toBe(1);
		expect(pointSegmentDistanceM([3, 0], [0, 0], [2, 0])).toBe(1);
	});
});
