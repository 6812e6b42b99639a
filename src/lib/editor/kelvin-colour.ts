/**
 * The colour of a light of a given colour temperature, for drawing its beam.
 *
 * Method: the chromaticity (CIE 1931 x, y) of a blackbody at T kelvin from the cubic-spline
 * approximation of the Planckian locus by B. Kim, H. Kang et al., "Design of Advanced Color
 * Temperature Control System for HDTV Applications", Journal of the Korean Physical Society 41 (2002)
 * 865–871 (valid 1667–25 000 K; coefficients as published there), then XYZ with Y = 1 to linear sRGB
 * with the matrix of IEC 61966-2-1:1999 (sRGB, D65 white), negative channels clipped, scaled so the
 * largest channel is 1, and encoded with the sRGB transfer curve. So the colour shows the hue of the
 * light at full brightness; 6500 K comes out close to white (D65 lies just off the locus).
 * kelvin-colour.test.ts checks the spline against CIE illuminant A and against Planck's law.
 */

export const MIN_KELVIN = 1667;
export const MAX_KELVIN = 25_000;

/** CIE 1931 (x, y) of a blackbody (Kim et al. 2002 cubic splines). */
export function planckianXy(kelvin: number): [number, number] {
	const t = Math.min(MAX_KELVIN, Math.max(MIN_KELVIN, kelvin));
	const t1 = 1e3 / t;
	const t2 = t1 * t1;
	const t3 = t2 * t1;
	const x =
		t <= 4000
			? -0.2661239 * t3 - 0.2343589 * t2 + 0.8776956 * t1 + 0.17991
			: -3.0258469 * t3 + 2.1070379 * t2 + 0.2226347 * t1 + 0.24039;
	const x2 = x * x;
	const x3 = x2 * x;
	const y =
		t <= 2222
			? -1.1063814 * x3 - 1.3481102 * x2 + 2.18555832 * x - 0.20219683
			: t <= 4000
				? -0.9549476 * x3 - 1.37418593 * x2 + 2.09137015 * x - 0.16748867
				: 3.081758 * x3 - 5.8733867 * x2 + 3.75112997 * x - 0.37001483;
	return [x, y];
}

/** Linear sRGB of a chromaticity at luminance Y = 1 (IEC 61966-2-1 matrix). */
export function xyToLinearSrgb(x: number, y: number): [number, number, number] {
	const X = x / y;
	const Z = (1 - x - y) / y;
	return [
		3.2406 * X - 1.5372 - 0.4986 * Z,
		-0.9689 * X + 1.8758 + 0.0415 * Z,
		0.0557 * X - 0.204 + 1.057 * Z
	];
}

/** The sRGB transfer curve (IEC 61966-2-1). */
export function srgbEncode(linear: number): number {
	return linear <= 0.0031308 ? 12.92 * linear : 1.055 * linear ** (1 / 2.4) - 0.055;
}

/** 8-bit sRGB of a light of `kelvin`, at full brightness. */
export function kelvinToRgb(kelvin: number): [number, number, number] {
	const [x, y] = planckianXy(kelvin);
	const lin = xyToLinearSrgb(x, y).map((c) => Math.max(0, c));
	const peak = Math.max(...lin);
	return lin.map((c) => Math.round(255 * srgbEncode(c / peak))) as [number, number, number];
}

export function rgbToHex([r, g, b]: readonly [number, number, number]): string {
	return `#${[r, g, b].map((c) => c.toString(16).padStart(2, '0')).join('')}`;
}

export function kelvinToHex(kelvin: number): string {
	return rgbToHex(kelvinToRgb(kelvin));
}
