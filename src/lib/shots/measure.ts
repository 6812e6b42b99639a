/**
 * The exposure a shot actually got, measured from its pixels, and a flash's real guide number from a
 * reading. Pure functions, shared by the server and the Shots section.
 */

/** sRGB's decoding to linear light, IEC 61966-2-1:1999 §5.2 (the piecewise curve, threshold 0.04045). */
export function srgbToLinear(encoded: number): number {
	return encoded <= 0.04045 ? encoded / 12.92 : ((encoded + 0.055) / 1.055) ** 2.4;
}

/** Relative luminance from linear R, G, B: ITU-R BT.709-6, item 3.3 (0.2126, 0.7152, 0.0722). */
export function luminance709(r: number, g: number, b: number): number {
	return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** Mid-grey: 18 % reflectance, what a meter's "correct" exposure renders (common practice). */
export const MID_GREY = 0.18;

/** Stops above (+) or below (−) a mid-grey exposure for a mean linear luminance; null for black. */
export function offsetFromLuminance(meanLuminance: number): number | null {
	return meanLuminance > 0 ? Math.log2(meanLuminance / MID_GREY) : null;
}

/** The 256 linear values of 8-bit sRGB codes, so a region of millions of pixels needs no power per pixel. */
export const SRGB8_TO_LINEAR: Float64Array = Float64Array.from({ length: 256 }, (_, code) => srgbToLinear(code / 255));

/**
 * Mean linear luminance of interleaved 8-bit sRGB pixels (`channels` 3 or 4; alpha ignored; 1 or 2 is
 * grey, luminance equal to the grey level's linear value).
 */
export function meanLuminance8(pixels: Uint8Array, channels: number): number {
	const lut = SRGB8_TO_LINEAR;
	const count = Math.floor(pixels.length / channels);
	if (!count) return 0;
	let sum = 0;
	if (channels >= 3) {
		for (let i = 0; i < pixels.length; i += channels) sum += 0.2126 * lut[pixels[i]] + 0.7152 * lut[pixels[i + 1]] + 0.0722 * lut[pixels[i + 2]];
	} else {
		for (let i = 0; i < pixels.length; i += channels) sum += lut[pixels[i]];
	}
	return sum / count;
}

/**
 * The exposure offset a meter reading implies for a shot: the meter asks for f/`meterAperture` at the
 * shot's shutter and ISO; the shot was made at f/`shotAperture`. Light scales with 1/N², so the shot got
 * 2·log2(meter / shot) stops more than mid-grey (common practice: one stop per √2 of f-number).
 */
export function offsetFromMeter(meterAperture: number, shotAperture: number): number {
	return 2 * Math.log2(meterAperture / shotAperture);
}

/**
 * A flash's real guide number from a flash-meter reading: GN = N × d / (√(ISO/100) · √power · 2^(−loss/2)).
 * The guide-number relation N = GN / d at ISO 100 and full power, scaled as in src/lib/light/flash.ts
 * (guide number ∝ √ISO and √power; a loss of L stops divides the light by 2^L, the guide number by 2^(L/2)).
 */
export function guideNumberFromMeter(reading: { aperture: number; distanceM: number; iso: number; power: number; lossStops: number }): number {
	const { aperture, distanceM, iso, power, lossStops } = reading;
	return (aperture * distanceM) / (Math.sqrt(iso / 100) * Math.sqrt(power) * 2 ** (-lossStops / 2));
}

/**
 * A flash's real guide number from a test shot: the shot measured `differenceStops` away from the plan
 * (actual − predicted). The flash's share of the predicted light is `flashShare`; the rest (ambient,
 * other lights) is taken as planned, and the flash is given what remains. Light ∝ GN², so
 * GN_real = GN × √(flash's actual / flash's predicted). Null when the measure leaves the flash nothing.
 */
export function guideNumberFromShot(ratedGuideNumberM: number, differenceStops: number, flashShare: number): number | null {
	const actualTotal = 2 ** differenceStops; // in units of the predicted total
	const flashActual = actualTotal - (1 - flashShare);
	if (flashShare <= 0 || flashActual <= 0) return null;
	return ratedGuideNumberM * Math.sqrt(flashActual / flashShare);
}

/**
 * How far a flash is from its rated guide number, in stops: light ∝ GN², so a guide number k times the
 * rated one is 2·log2(k) stops (the guide number definition, see `$lib/light/flash.ts`). This is the
 * shelf's `calibrationOffsetStops`.
 */
export function calibrationOffsetStops({ guideNumberM, ratedGuideNumberM }: { guideNumberM: number; ratedGuideNumberM: number }): number {
	return 2 * Math.log2(guideNumberM / ratedGuideNumberM);
}

/** The guide number a calibration of `offsetStops` gives a flash rated `ratedGuideNumberM` (the inverse). */
export function calibratedGuideNumber(ratedGuideNumberM: number, offsetStops: number): number {
	return ratedGuideNumberM * 2 ** (offsetStops / 2);
}

/** Warn when more than a tenth of the planned light at the subject is not this flash. */
export const FLASH_DOMINANCE_SHARE = 0.9;
