/**
 * Flash: the guide number scaled by ISO, power and losses; the aperture for a correct exposure; the
 * offset at a set aperture; the power needed; the flash's third-stop power ladder; several flashes on
 * one subject; and what high-speed sync costs.
 *
 * Guide number definition: GN = distance × f-number for a correct exposure, quoted at ISO 100 and full
 * power. Exposure goes with GN², so GN scales with √(ISO/100) and √power, and a loss of L stops divides
 * GN by 2^(L/2).
 */
import { flashNearLivingSubjectCaution, LIVING_SUBJECT_FLASH_DISTANCE_M } from './cautions';
import { apertureFactor, type LensSetup, type MagnificationMethod } from './optics';

export const LADDER_STEPS = 24; // full power down to 1/256 in thirds: 2^(−k/3), k = 0…24
export const LOWEST_POWER = 2 ** (-LADDER_STEPS / 3);

export interface GuideNumberInput {
	guideNumber: number;
	iso?: number;
	power?: number;
	lossStops?: number;
	/** Measured against a meter or a test shot (the gear shelf): + = the flash gives more than its GN says. */
	calibrationOffsetStops?: number;
}

/**
 * GN × √(ISO/100) × √power × 2^(−lossStops/2) (API: /api/v1/openapi.json), times 2^(calibration/2) for a
 * flash whose measured output differs from its guide number (0 unless given).
 */
export function effectiveGuideNumber({ guideNumber, iso = 100, power = 1, lossStops = 0, calibrationOffsetStops = 0 }: GuideNumberInput): number {
	return guideNumber * Math.sqrt(iso / 100) * Math.sqrt(power) * 2 ** ((calibrationOffsetStops - lossStops) / 2);
}

/** The working f-number that gives a correct exposure at `distanceM`: GN_eff / d. */
export function workingApertureForCorrect(effectiveGn: number, distanceM: number): number {
	return effectiveGn / distanceM;
}

/** Exposure offset in stops at a working aperture, positive = over: 2·log2(N_correct / N_w). */
export function flashExposureOffsetStops(workingApertureCorrect: number, workingApertureSet: number): number {
	return 2 * Math.log2(workingApertureCorrect / workingApertureSet);
}

/**
 * The exact power fraction for a correct exposure at a working aperture (may exceed 1):
 * (N_w · d / GN_full)², where GN_full is the guide number at this ISO and loss at full power.
 */
export function requiredPower(
	input: Omit<GuideNumberInput, 'power'>,
	distanceM: number,
	workingApertureSet: number
): number {
	const fullPowerGn = effectiveGuideNumber({ ...input, power: 1 });
	return ((workingApertureSet * distanceM) / fullPowerGn) ** 2;
}

export interface PowerStep {
	/** Ladder index: fraction = 2^(−k/3). */
	k: number;
	fraction: number;
	label: string;
}

/** Label of ladder step k: `1/1`, `1/2`, … `1/256` on whole stops; `1/8 +0.3`, `1/8 +0.7` between. */
export function powerStepLabel(k: number): string {
	const wholeBelow = Math.ceil(k / 3) * 3; // the whole stop at or below this step
	const thirdsAbove = wholeBelow - k;
	const base = `1/${2 ** (wholeBelow / 3)}`;
	if (thirdsAbove === 0) return base;
	return `${base} +${thirdsAbove === 1 ? '0.3' : '0.7'}`;
}

/** The ladder from full power (k = 0) to 1/256 (k = 24). */
export const powerLadder: readonly PowerStep[] = Array.from({ length: LADDER_STEPS + 1 }, (_, k) => ({
	k,
	fraction: 2 ** (-k / 3),
	label: powerStepLabel(k)
}));

export interface NearestPowerStep {
	fraction: number;
	label: string;
	/** Exposure error left at this step, positive = over: log2(step / required). */
	residualStops: number;
}

/**
 * The last ladder step a flash has: its lowest power (from the gear shelf) rounded to the third-stop
 * ladder, never below 1/256. A flash that stops at 1/128 ends at k = 21.
 */
export function lowestLadderStep(lowestPower = LOWEST_POWER): number {
	return Math.min(LADDER_STEPS, Math.max(0, Math.round(-3 * Math.log2(lowestPower) - 1e-9)));
}

/**
 * The ladder step nearest to `required` in stops: full power when more is needed, the flash's lowest
 * step (1/256 unless given) when less is. Ties go to the stronger step.
 */
export function nearestPowerStep(required: number, lowestPower = LOWEST_POWER): NearestPowerStep {
	const stopsDown = -Math.log2(required) * 3; // in thirds below full power
	const k = Math.min(lowestLadderStep(lowestPower), Math.max(0, Math.round(stopsDown - 1e-9)));
	const step = powerLadder[k];
	return { fraction: step.fraction, label: step.label, residualStops: Math.log2(step.fraction / required) };
}

/** Whether the flash can give exactly `required`: within full power and its lowest step. */
export function powerWithinRange(required: number, lowestPower = LOWEST_POWER): boolean {
	const lowest = powerLadder[lowestLadderStep(lowestPower)].fraction;
	return required <= 1 + 1e-12 && required >= lowest * (1 - 1e-12);
}

/**
 * Several flashes on one subject add their exposures (X ∝ GN²), so from the same distance their
 * combined guide number is √(Σ GN²): two equal flashes give one stop more.
 */
export function combinedGuideNumber(guideNumbers: readonly number[]): number {
	return Math.sqrt(guideNumbers.reduce((s, g) => s + g * g, 0));
}

/** Flash exposure in exposure units (1 = correct): (GN_eff / (d · N_w))². */
export function flashExposure(effectiveGn: number, distanceM: number, workingApertureSet: number): number {
	return (effectiveGn / (distanceM * workingApertureSet)) ** 2;
}

/**
 * High-speed sync. Model (ours, stated): above the sync speed the flash fires a long run of pulses that
 * lasts the whole travel of the shutter slit, so the sensor gets only the share of that light that
 * passes while the slit is open, shutter/syncSpeed; and switching to pulsed output costs a further
 * `entryLossStops` (common practice: about one stop; the flash's manual has the real figure).
 * Exposure factor: 2^(−entry) × shutter/sync; the guide number factor is its square root.
 */
export const HSS_ENTRY_LOSS_STOPS = 1;

export function highSpeedSyncFactor(shutterS: number, syncSpeedS: number, entryLossStops = HSS_ENTRY_LOSS_STOPS): number {
	if (shutterS >= syncSpeedS) return 1;
	return 2 ** -entryLossStops * (shutterS / syncSpeedS);
}

export function highSpeedSyncGuideNumber(
	guideNumber: number,
	shutterS: number,
	syncSpeedS: number,
	entryLossStops = HSS_ENTRY_LOSS_STOPS
): number {
	return guideNumber * Math.sqrt(highSpeedSyncFactor(shutterS, syncSpeedS, entryLossStops));
}

export interface FlashCalcInput extends LensSetup {
	guideNumber: number;
	distance: number;
	iso: number;
	power: number;
	lossStops: number;
	magnification: number;
	pupilMagnification: number;
	magnificationBy?: MagnificationMethod;
	teleconverterFactor?: number;
	calibrationOffsetStops?: number;
	lowestPower?: number;
	/** The subject's depth along the flash's line, mm: the falloff from its front to its back. */
	subjectDepthMm?: number;
	/** The lens's marked range: a suggested aperture outside it is flagged. */
	widestAperture?: number;
	narrowestAperture?: number;
	aperture?: number;
	/** Extra: the subject is a person or an animal (short-range flash caution). */
	living?: boolean;
}

export interface FlashCalcResult {
	effectiveGuideNumber: number;
	workingApertureForCorrect: number;
	markedApertureForCorrect: number;
	bellowsFactor: number;
	workingAperture?: number;
	exposureOffsetStops?: number;
	requiredPower?: number;
	withinRange?: boolean;
	nearestPowerStep?: NearestPowerStep;
	/** The lowest step of this flash's ladder (1/256 unless `lowestPower` is given). */
	lowestPowerStep: { fraction: number; label: string };
	/** With `subjectDepthMm`: stops the front (at distance − depth/2) gets more than the back (+ depth/2). */
	depthFalloffStops?: number;
	/** `markedApertureForCorrect` is wider or narrower than the lens's marked range, when that is given. */
	markedApertureOutsideLens?: 'wider' | 'narrower';
	cautions: string[];
}

/**
 * Inverse-square falloff across a subject's depth, along the light's line: the plane of focus at
 * `distanceM`, the front half the depth nearer, the back half farther: 2·log2((d + D/2) / (d − D/2)).
 * A front nearer than 1 mm counts as 1 mm (as the scene does).
 */
export function depthFalloffStops(distanceM: number, depthM: number): number {
	return 2 * Math.log2((distanceM + depthM / 2) / Math.max(0.001, distanceM - depthM / 2));
}

/** `POST /api/v1/calc/flash` (see /api/v1/openapi.json). */
export function flashCalc(input: FlashCalcInput): FlashCalcResult {
	const gn = effectiveGuideNumber(input);
	const correctWorking = workingApertureForCorrect(gn, input.distance);
	const factor = apertureFactor(input);
	const marked = correctWorking / factor;
	const lowest = powerLadder[lowestLadderStep(input.lowestPower)];
	const result: FlashCalcResult = {
		effectiveGuideNumber: gn,
		workingApertureForCorrect: correctWorking,
		markedApertureForCorrect: marked,
		bellowsFactor: factor * factor,
		lowestPowerStep: { fraction: lowest.fraction, label: lowest.label },
		cautions:
			input.living && input.distance < LIVING_SUBJECT_FLASH_DISTANCE_M
				? [flashNearLivingSubjectCaution('flash', input.distance).message]
				: []
	};
	if (input.subjectDepthMm !== undefined) result.depthFalloffStops = depthFalloffStops(input.distance, input.subjectDepthMm / 1000);
	if (input.widestAperture !== undefined && marked < input.widestAperture * (1 - 1e-9)) result.markedApertureOutsideLens = 'wider';
	if (input.narrowestAperture !== undefined && marked > input.narrowestAperture * (1 + 1e-9)) result.markedApertureOutsideLens = 'narrower';
	if (input.aperture !== undefined) {
		const wa = input.aperture * factor;
		const required = requiredPower(input, input.distance, wa);
		result.workingAperture = wa;
		result.exposureOffsetStops = flashExposureOffsetStops(correctWorking, wa);
		result.requiredPower = required;
		result.withinRange = powerWithinRange(required, input.lowestPower);
		result.nearestPowerStep = nearestPowerStep(required, input.lowestPower);
	}
	return result;
}
