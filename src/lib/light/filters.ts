/**
 * Filters over the lens or the light: filter factor and stops, neutral density and stops, a polariser.
 *
 * A filter factor F multiplies the exposure needed, so it costs log2(F) stops. A neutral density filter
 * of optical density D transmits 10^(−D), so it costs D / log10(2) ≈ D / 0.301 stops: ND 0.3 is one
 * stop, ND 0.9 three, ND 3.0 ten.
 */

export function filterFactorToStops(factor: number): number {
	return Math.log2(factor);
}

export function stopsToFilterFactor(stops: number): number {
	return 2 ** stops;
}

export function densityToTransmittance(density: number): number {
	return 10 ** -density;
}

export function transmittanceToStops(transmittance: number): number {
	return -Math.log2(transmittance);
}

export function ndDensityToStops(density: number): number {
	return density / Math.log10(2);
}

export function stopsToNdDensity(stops: number): number {
	return stops * Math.log10(2);
}

/** The filter factor of an ND filter: 10^D. */
export function ndDensityToFilterFactor(density: number): number {
	return 10 ** density;
}

/**
 * A polariser costs about 1.5 stops (common practice: 1⅓ to 2 stops depending on the filter and its
 * rotation; meter through it when it matters).
 */
export const POLARISER_LOSS_STOPS = 1.5;

/** Stacked filters multiply their factors, so their stops add. */
export function combinedLossStops(...stops: number[]): number {
	return stops.reduce((a, b) => a + b, 0);
}
