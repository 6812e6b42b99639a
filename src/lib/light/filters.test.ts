import { describe, expect, it } from 'vitest';
import {
	combinedLossStops,
	densityToTransmittance,
	filterFactorToStops,
	ndDensityToFilterFactor,
	ndDensityToStops,
	POLARISER_LOSS_STOPS,
	stopsToFilterFactor,
	stopsToNdDensity,
	transmittanceToStops
} from './filters';

describe('filter factors and neutral density', () => {
	it('filter factor 2 is one stop, 4 is two, 8 is three', () => {
		// Source: filter factor = exposure multiplier, stops = log2(factor) (Kodak Photographic Filters
		// Handbook, filter factors; from memory).
		expect(filterFactorToStops(2)).toBe(1);
		expect(filterFactorToStops(4)).toBe(2);
		expect(filterFactorToStops(8)).toBe(3);
	});

	it('filter factor 1.5 is about 0.6 stop', () => {
		// Source: as above, log2(1.5) = 0.585 (handbooks round it to ⅔ stop).
		expect(filterFactorToStops(1.5)).toBeCloseTo(0.585, 3);
	});

	it('ND 0.3 is one stop (factor 2)', () => {
		// Source: optical density D = −log10(T), 0.3 ≈ log10 2 (Kodak Photographic Filters Handbook, neutral
		// density filters; from memory).
		expect(ndDensityToStops(0.3)).toBeCloseTo(1, 2);
		expect(ndDensityToFilterFactor(0.3)).toBeCloseTo(2, 2);
	});

	it('ND 0.9 is three stops (factor 8), transmitting 12.6 %', () => {
		// Source: as above, 10^−0.9 = 0.126.
		expect(ndDensityToStops(0.9)).toBeCloseTo(3, 1);
		expect(densityToTransmittance(0.9)).toBeCloseTo(0.126, 3);
	});

	it('ND 3.0 is ten stops, transmitting 0.1 %', () => {
		// Source: as above, 10^−3 = 0.001, log2(1000) = 9.97.
		expect(ndDensityToStops(3)).toBeCloseTo(9.97, 2);
		expect(densityToTransmittance(3)).toBeCloseTo(0.001, 12);
	});

	it('50 % transmittance is one stop; stops and density round-trip', () => {
		// Source: definition of the stop as a factor of 2 (APEX, ANSI PH2.5).
		expect(transmittanceToStops(0.5)).toBe(1);
		expect(stopsToNdDensity(ndDensityToStops(0.6))).toBeCloseTo(0.6, 12);
		expect(stopsToFilterFactor(3)).toBe(8);
	});

	it('a polariser costs about 1.5 stops', () => {
		// Common practice: 1⅓ to 2 stops for a polariser.
		expect(POLARISER_LOSS_STOPS).toBeGreaterThanOrEqual(1.33);
		expect(POLARISER_LOSS_STOPS).toBeLessThanOrEqual(2);
	});

	it('stacked filters: stops add (factors multiply)', () => {
		// Source: filter factors multiply when filters are stacked (Kodak handbook, from memory).
		expect(combinedLossStops(filterFactorToStops(2), filterFactorToStops(4))).toBeCloseTo(filterFactorToStops(8), 12);
	});
});
