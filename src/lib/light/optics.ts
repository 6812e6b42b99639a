/**
 * Macro optics: working aperture and light loss at a magnification, magnification from extension and
 * from close-up lenses, close-up depth of field, hyperfocal distance, the Airy disk, and the aperture
 * that balances depth of field against diffraction.
 *
 * Conventions: `aperture` is the marked f-number N; the working (effective) f-number is
 * N_w = N × (1 + m/P) for magnification m and pupil magnification P (exit/entrance pupil diameter).
 */
import { stackPlan, type StackPlan } from './stack';

/** N × (1 + m/P) (API: /api/v1/openapi.json). */
export function workingAperture(markedAperture: number, magnification: number, pupilMagnification = 1): number {
	return markedAperture * (1 + magnification / pupilMagnification);
}

/**
 * How the magnification is made, which decides what it costs in light:
 * - `extension`: tubes, bellows or a macro lens's own focusing (m = e/f): N_w = N × (1 + m/P), the default.
 * - `close-up-lens`: a dioptre in front of a lens focused at infinity: the image stays at the focal
 *   plane, so N_w = N (no loss).
 * - `reversed-lens`: the lens turned round, so its pupils swap: the entrance pupil is the old exit pupil
 *   (N becomes N/P) and the pupil magnification becomes 1/P: N_w = (N/P) × (1 + m·P) = N × (1/P + m).
 * - `camera-shows-working`: the camera already shows the working aperture: no correction on top.
 * A teleconverter of factor k (1 without one) behind the lens multiplies the f-number by k and the
 * lens's own magnification is m/k: N_w = k × N × (1 + m/(k·P)) for extension, k × N × (1/P + m/k)
 * reversed, k × N with a close-up lens.
 * Source: effective f-number N(1 + m/P) and the pupils of a reversed lens (from memory: the usual
 * close-up photography treatment, e.g. The Manual of Photography's close-up chapter).
 */
export const MAGNIFICATION_METHODS = ['extension', 'close-up-lens', 'reversed-lens', 'camera-shows-working'] as const;
export type MagnificationMethod = (typeof MAGNIFICATION_METHODS)[number];

export interface LensSetup {
	magnification: number;
	pupilMagnification?: number;
	magnificationBy?: MagnificationMethod;
	teleconverterFactor?: number;
}

/** N_w / N for a lens setup: the factor the marked aperture is multiplied by at this magnification. */
export function apertureFactor({ magnification: m, pupilMagnification: p = 1, magnificationBy = 'extension', teleconverterFactor: k = 1 }: LensSetup): number {
	switch (magnificationBy) {
		case 'close-up-lens':
			return k;
		case 'reversed-lens':
			return k / p + m;
		case 'camera-shows-working':
			return 1;
		default:
			return k + m / p;
	}
}

/** The working f-number of a marked aperture on a lens setup (the one rule every question and the scene use). */
export function workingApertureOf(markedAperture: number, lens: LensSetup): number {
	return markedAperture * apertureFactor(lens);
}

/** The marked aperture that gives a working aperture: N_w / (1 + m/P). */
export function markedApertureFor(workingF: number, magnification: number, pupilMagnification = 1): number {
	return workingF / (1 + magnification / pupilMagnification);
}

/** Bellows factor (1 + m/P)²: how much more exposure the lens needs at m than at infinity. */
export function bellowsFactor(magnification: number, pupilMagnification = 1): number {
	return (1 + magnification / pupilMagnification) ** 2;
}

/** Light lost to magnification in stops: 2·log2(1 + m/P) (API: /api/v1/openapi.json). */
export function lightLossStops(magnification: number, pupilMagnification = 1): number {
	return 2 * Math.log2(1 + magnification / pupilMagnification);
}

/** Thin lens: extension beyond infinity focus gives m = extension / f. */
export function magnificationFromExtension(extensionMm: number, focalLengthMm: number, baseMagnification = 0): number {
	return baseMagnification + extensionMm / focalLengthMm;
}

/** The extension beyond infinity focus for a magnification: m × f. */
export function extensionForMagnification(magnification: number, focalLengthMm: number): number {
	return magnification * focalLengthMm;
}

/**
 * Close-up lens of D dioptres on a lens of focal length f focused at infinity: the subject sits at the
 * close-up lens's focal length 1/D, and m = f × D / 1000 (f in mm). Focused closer, the prime lens's own
 * magnification adds: m = m₀ + f·D/1000 (thin lenses in contact).
 */
export function magnificationFromCloseUpLens(dioptres: number, focalLengthMm: number, baseMagnification = 0): number {
	return baseMagnification + (focalLengthMm * dioptres) / 1000;
}

/** Thin-lens subject distance from the front principal plane for a magnification: u = f(1 + 1/m). */
export function subjectDistanceMm(magnification: number, focalLengthMm: number): number {
	return focalLengthMm * (1 + 1 / magnification);
}

/**
 * Total depth of field, close-up approximation (valid where the subject is much nearer than the
 * hyperfocal distance): DoF = 2·N·c·(1 + m/P) / m² (/api/v1/openapi.json), N marked, c the circle of confusion.
 */
export function closeUpDepthOfFieldMm(
	markedAperture: number,
	magnification: number,
	cocMm = 0.03,
	pupilMagnification = 1
): number {
	return (2 * markedAperture * cocMm * (1 + magnification / pupilMagnification)) / (magnification * magnification);
}

/**
 * Total depth of field from the working aperture, close-up approximation: 2 · N_w · c / m². With
 * N_w = N(1 + m/P) it is the API's formula; a close-up lens (N_w = N) or a reversed lens follows from
 * its own working aperture. Source: the close-up depth of field in image space, blur c at N_w
 * (Wikipedia, "Depth of field", close-up approximation).
 */
export function depthOfFieldFromWorkingMm(workingF: number, magnification: number, cocMm = 0.03): number {
	return (2 * workingF * cocMm) / (magnification * magnification);
}

export interface DepthOfField {
	/** Total depth of field, mm (null when the far limit is at infinity). */
	totalMm: number | null;
	/** Sharp zone in front of and behind the plane of focus, mm (behind null when it reaches infinity). */
	inFrontMm: number;
	behindMm: number | null;
	/** Distances from the lens of the near and far limits, mm (far null at infinity); thin-lens only. */
	nearMm?: number;
	farMm?: number | null;
	subjectDistanceMm?: number;
	formula: 'thin-lens' | 'close-up';
}

/**
 * Thin-lens depth of field (Wikipedia, "Depth of field", the formulae in terms of the hyperfocal
 * distance): subject at s = f(1 + 1/m), H = f²/(N·c) + f, near limit s(H − f)/(H + s − 2f), far limit
 * s(H − f)/(H − s), infinite when s ≥ H. N is the marked aperture (a symmetric thin lens); far from 1:1
 * the sharp zone behind the subject is longer than the one in front.
 */
export function thinLensDepthOfField(markedAperture: number, magnification: number, focalLengthMm: number, cocMm = 0.03): DepthOfField {
	const f = focalLengthMm;
	const s = subjectDistanceMm(magnification, f);
	const h = hyperfocalDistanceMm(f, markedAperture, cocMm);
	const near = (s * (h - f)) / (h + s - 2 * f);
	const far = s < h ? (s * (h - f)) / (h - s) : null;
	return {
		totalMm: far === null ? null : far - near,
		inFrontMm: s - near,
		behindMm: far === null ? null : far - s,
		nearMm: near,
		farMm: far,
		subjectDistanceMm: s,
		formula: 'thin-lens'
	};
}

/**
 * The close-up formula splits the zone evenly (it holds where the subject is far nearer than the
 * hyperfocal distance, at m ≳ 0.1); with a focal length the thin-lens formula answers instead, which
 * holds at every magnification.
 */
export function depthOfField(markedAperture: number, lens: LensSetup, cocMm = 0.03, focalLengthMm?: number): DepthOfField {
	if (focalLengthMm !== undefined) return thinLensDepthOfField(markedAperture, lens.magnification, focalLengthMm, cocMm);
	const total = depthOfFieldFromWorkingMm(workingApertureOf(markedAperture, lens), lens.magnification, cocMm);
	return { totalMm: total, inFrontMm: total / 2, behindMm: total / 2, formula: 'close-up' };
}

/** Hyperfocal distance H = f²/(N·c) + f, in mm. */
export function hyperfocalDistanceMm(focalLengthMm: number, markedAperture: number, cocMm = 0.03): number {
	return (focalLengthMm * focalLengthMm) / (markedAperture * cocMm) + focalLengthMm;
}

/** Airy disk diameter to the first minimum, 2.44·λ·N_w, in µm (λ in nm). */
export function airyDiskUm(workingF: number, wavelengthNm = 550): number {
	return (2.44 * wavelengthNm * workingF) / 1000;
}

/** Diffraction costs more than the circle of confusion allows when the Airy disk is larger than c. */
export function isDiffractionLimited(workingF: number, cocMm = 0.03, wavelengthNm = 550): boolean {
	return airyDiskUm(workingF, wavelengthNm) > cocMm * 1000;
}

/** The working f-number at which the Airy disk equals the circle of confusion: c / (2.44 λ). */
export function diffractionLimitWorkingAperture(cocMm = 0.03, wavelengthNm = 550): number {
	return (cocMm * 1e6) / (2.44 * wavelengthNm);
}

/**
 * The aperture that balances depth of field against diffraction for a subject depth D (mm).
 * Model (ours, stated): a point at the front or back of the subject, D/2 from the plane of focus, lies
 * D·m²/2 from focus in image space (longitudinal magnification m²), so its blur is (D·m²/2)/N_w; the
 * diffraction blur is 2.44·λ·N_w. Their sum (or root-sum-square) is least where the two are equal:
 * N_w = m·√(D / (4.88·λ)). Returned as working and marked f-numbers with the blur there.
 */
export function balancedAperture(
	subjectDepthMm: number,
	magnification: number,
	pupilMagnification = 1,
	wavelengthNm = 550
): { workingAperture: number; markedAperture: number; blurUm: number } {
	const lambdaMm = wavelengthNm * 1e-6;
	const wa = magnification * Math.sqrt(subjectDepthMm / (4.88 * lambdaMm));
	return {
		workingAperture: wa,
		markedAperture: markedApertureFor(wa, magnification, pupilMagnification),
		blurUm: 2 * airyDiskUm(wa, wavelengthNm)
	};
}

/**
 * The circle of confusion from the sensor: its diagonal / 1500 (the usual convention for a print seen
 * whole: 0.029 mm on a 36 × 24 mm sensor; Wikipedia, "Circle of confusion", the "d/1500" rule), or,
 * for stacks meant to hold detail to the pixel, two pixel pitches (common practice: the Nyquist limit
 * of the sensor's sampling).
 */
export const COC_DIAGONAL_DIVISOR = 1500;
export const PIXEL_COC_PITCHES = 2;

export interface CocInput {
	cocMm?: number;
	sensorWidthMm?: number;
	sensorHeightMm?: number;
	pixelPitchUm?: number;
	/** Which circle the sensor gives: `sensor` (d/1500, the default) or `pixel` (two pixel pitches). */
	cocBasis?: 'sensor' | 'pixel';
}

export type CocSource = 'given' | 'sensor-diagonal' | 'pixel-pitch' | 'default';

/** The circle of confusion a question uses, and where it came from: given, from the sensor, or 0.03 mm. */
export function circleOfConfusion(input: CocInput, fallbackMm = 0.03): { cocMm: number; from: CocSource } {
	if (input.cocMm !== undefined) return { cocMm: input.cocMm, from: 'given' };
	if (input.cocBasis === 'pixel' && input.pixelPitchUm !== undefined) {
		return { cocMm: (PIXEL_COC_PITCHES * input.pixelPitchUm) / 1000, from: 'pixel-pitch' };
	}
	if (input.sensorWidthMm !== undefined && input.sensorHeightMm !== undefined) {
		return { cocMm: Math.hypot(input.sensorWidthMm, input.sensorHeightMm) / COC_DIAGONAL_DIVISOR, from: 'sensor-diagonal' };
	}
	return { cocMm: fallbackMm, from: 'default' };
}

/** What "diffraction-limited" means here, in words: where the Airy disk outgrows the circle of confusion. */
export function diffractionSoftensText(markedFrom: number, cocMm: number): string {
	const f = markedFrom >= 10 ? Math.round(markedFrom) : Number(markedFrom.toPrecision(2));
	return `diffraction softens detail from f/${f} marked (the Airy disk outgrows the ${Math.round(cocMm * 1000)} µm circle of confusion at this sensor)`;
}

export interface OpticsCalcInput extends CocInput, LensSetup {
	aperture: number;
	magnification: number;
	pupilMagnification: number;
	wavelengthNm: number;
	focalLengthMm?: number;
	subjectDepthMm?: number;
	overlap: number;
}

export interface OpticsCalcResult {
	workingAperture: number;
	lightLossStops: number;
	bellowsFactor: number;
	dofMm: number;
	/** The depth of field with its near and far parts, and which formula answered. */
	depthOfField: DepthOfField;
	airyDiskUm: number;
	diffractionLimited: boolean;
	/** Marked aperture at which the Airy disk reaches the circle of confusion. */
	diffractionLimitAperture: number;
	/** The circle of confusion used, mm, and where it came from. */
	cocMm: number;
	cocFrom: CocSource;
	/** What `diffractionLimited` means, in words. */
	diffractionNote: string;
	extensionMm?: number;
	subjectDistanceMm?: number;
	stack?: StackPlan;
	balancedAperture?: { workingAperture: number; markedAperture: number; blurUm: number };
}

/** `POST /api/v1/calc/optics` (see /api/v1/openapi.json). */
export function opticsCalc(input: OpticsCalcInput): OpticsCalcResult {
	const { aperture, magnification: m, wavelengthNm } = input;
	const { cocMm, from } = circleOfConfusion(input);
	const factor = apertureFactor(input);
	const wa = aperture * factor;
	// The contract's dofMm is the close-up formula at the working aperture; the thin-lens one is beside it.
	const dofMm = depthOfFieldFromWorkingMm(wa, m, cocMm);
	const limitMarked = diffractionLimitWorkingAperture(cocMm, wavelengthNm) / factor;
	const result: OpticsCalcResult = {
		workingAperture: wa,
		lightLossStops: 2 * Math.log2(factor),
		bellowsFactor: factor * factor,
		dofMm,
		depthOfField: depthOfField(aperture, input, cocMm, input.focalLengthMm),
		airyDiskUm: airyDiskUm(wa, wavelengthNm),
		diffractionLimited: isDiffractionLimited(wa, cocMm, wavelengthNm),
		diffractionLimitAperture: limitMarked,
		cocMm,
		cocFrom: from,
		diffractionNote: diffractionSoftensText(limitMarked, cocMm)
	};
	if (input.focalLengthMm !== undefined) {
		result.extensionMm = extensionForMagnification(m, input.focalLengthMm);
		result.subjectDistanceMm = subjectDistanceMm(m, input.focalLengthMm);
	}
	if (input.subjectDepthMm !== undefined) {
		result.stack = stackPlan(input.subjectDepthMm, dofMm, input.overlap);
		const b = balancedAperture(input.subjectDepthMm, m, 1, wavelengthNm);
		result.balancedAperture = { ...b, markedAperture: b.workingAperture / factor };
	}
	return result;
}
