/**
 * Lights with a size: a softbox, a dome or a panel close to the subject is not a point. Treated as a
 * Lambertian emitter of uniform radiance L, the illuminance it gives a small surface facing it on its
 * axis at distance d is E = π·L·F, with F the configuration (view) factor from the surface to the
 * emitter (Howell, "A Catalog of Radiation Heat Transfer Configuration Factors": a differential planar
 * element to a parallel coaxial disc, and to a parallel rectangle, the latter as four rectangles with a
 * corner on the normal). Far away F → A/(π·d²), so the same light as a point of intensity I = L·A gives
 * I/d²; the ratio of the two is what a size changes:
 *   disc of radius r:    E / E_point = d² / (r² + d²)
 *   rectangle a × b:     E / E_point = π·d²·F(a, b, d) / (a·b)
 * Beyond five times its size a source is taken as a point (the ratio is then within 1.5 %), so the
 * falloff map pays nothing for sizes far away. Off the axis the ratio at the same distance is used
 * (ours, stated: the beam's own falloff already shapes the light off axis).
 */

/** A sized light's face: a disc (a dome, a round reflector) or a rectangle (a softbox, a panel). */
export type EmitterSize = { shape: 'disc'; diameterM: number } | { shape: 'rectangle'; widthM: number; heightM: number };

/** Beyond this many sizes (the largest side or the diameter) the point law is used. */
export const POINT_LAW_BEYOND_SIZES = 5;

/** Configuration factor from a differential element to a coaxial parallel disc: r² / (r² + d²). */
export function discConfigurationFactor(radiusM: number, distanceM: number): number {
	return (radiusM * radiusM) / (radiusM * radiusM + distanceM * distanceM);
}

/**
 * Configuration factor from a differential element to a parallel rectangle a × b whose corner lies on
 * the element's normal at distance c: (1/2π)·[A/√(1+A²)·atan(B/√(1+A²)) + B/√(1+B²)·atan(A/√(1+B²))],
 * A = a/c, B = b/c.
 */
export function cornerRectangleConfigurationFactor(aM: number, bM: number, cM: number): number {
	const A = aM / cM;
	const B = bM / cM;
	const sA = Math.sqrt(1 + A * A);
	const sB = Math.sqrt(1 + B * B);
	return ((A / sA) * Math.atan(B / sA) + (B / sB) * Math.atan(A / sB)) / (2 * Math.PI);
}

/** Configuration factor to a parallel rectangle centred on the normal: four corner rectangles. */
export function centredRectangleConfigurationFactor(widthM: number, heightM: number, distanceM: number): number {
	return 4 * cornerRectangleConfigurationFactor(widthM / 2, heightM / 2, distanceM);
}

export function largestSideM(size: EmitterSize): number {
	return size.shape === 'disc' ? size.diameterM : Math.max(size.widthM, size.heightM);
}

/** What a size does to the point law at a distance: E_sized / E_point (1 beyond five sizes). */
export function sizedSourceFactor(size: EmitterSize, distanceM: number): number {
	if (distanceM >= POINT_LAW_BEYOND_SIZES * largestSideM(size)) return 1;
	if (size.shape === 'disc') {
		const r = size.diameterM / 2;
		return (distanceM * distanceM) / (r * r + distanceM * distanceM);
	}
	const area = size.widthM * size.heightM;
	return (Math.PI * distanceM * distanceM * centredRectangleConfigurationFactor(size.widthM, size.heightM, distanceM)) / area;
}

/** Which model answered at a distance: the sized source's, or the point law beyond five sizes. */
export function sourceModelAt(size: EmitterSize | undefined, distanceM: number): 'point' | 'disc' | 'rectangle' {
	if (!size || distanceM >= POINT_LAW_BEYOND_SIZES * largestSideM(size)) return 'point';
	return size.shape;
}
