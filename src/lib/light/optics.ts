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

export interface OpticsCalcInput {
	aperture: number;
	magnification: number;
	pupilMagnification: number;
	cocMm: number;
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
	airyDiskUm: number;
	diffractionLimited: boolean;
	/** Marked aperture at which the Airy disk reaches the circle of confusion. */
	diffractionLimitAperture: number;
	extensionMm?: number;
	subjectDistanceMm?: number;
	stack?: StackPlan;
	balancedAperture?: { workingAperture: number; markedAperture: number; blurUm: number };
}

/** `POST /api/v1/calc/optics` (see /api/v1/openapi.json). */
export function opticsCalc(input: OpticsCalcInput): OpticsCalcResult {
	const { aperture, magnification: m, pupilMagnification: p, cocMm, wavelengthNm } = input;
	const wa = workingAperture(aperture, m, p);
	const dofMm = closeUpDepthOfFieldMm(aperture, m, cocMm, p);
	const result: OpticsCalcResult = {
		workingAperture: wa,
		lightLossStops: lightLossStops(m, p),
		bellowsFactor: bellowsFactor(m, p),
		dofMm,
		airyDiskUm: airyDiskUm(wa, wavelengthNm),
		diffractionLimited: isDiffractionLimited(wa, cocMm, wavelengthNm),
		diffractionLimitAperture: markedApertureFor(diffractionLimitWorkingAperture(cocMm, wavelengthNm), m, p)
	};
	if (input.focalLengthMm !== undefined) {
		result.extensionMm = extensionForMagnification(m, input.focalLengthMm);
		result.subjectDistanceMm = subjectDistanceMm(m, input.focalLengthMm);
	}
	if (input.subjectDepthMm !== undefined) {
		result.stack = stackPlan(input.subjectDepthMm, dofMm, input.overlap);
		result.balancedAperture = balancedAperture(input.subjectDepthMm, m, p, wavelengthNm);
	}
	return result;
}
