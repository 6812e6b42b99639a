/**
 * Ambient light: EV at ISO 100 from a meter reading, from incident illuminance (ISO 2720's calibration
 * constant C), from luminance (reflected constant K) or from a sky preset; the exposure offset at given
 * settings; the shutter for a correct exposure; and the flash-to-ambient balance.
 *
 * The exposure equations (ISO 2720 / ANSI PH2.5 meter calibration):
 *   reflected:  N²/t = L·S/K     (L luminance in cd/m², S the ISO speed, K ≈ 12.5)
 *   incident:   N²/t = E·S/C     (E illuminance in lux, C = 250 for a flat receptor, ≈ 320–340 for a
 *                                 hemispherical one)
 * and EV = log2(N²/t), so EV at ISO 100 is log2(E·100/C) or log2(L·100/K).
 */
import { workingApertureOf, type MagnificationMethod } from './optics';

export const CALIBRATION_C_FLAT = 250;
export const CALIBRATION_K_REFLECTED = 12.5;

/**
 * Sky presets: EV at ISO 100 by the "sunny 16" rule (common practice: f/16 at 1/ISO in bright sun,
 * one stop wider for each step duller). Real light varies with season, hour and latitude: meter it
 * when it matters.
 */
export const SKY_PRESETS = {
	'bright-sun': { ev100: 15, label: 'Bright sun, distinct shadows' },
	'hazy-sun': { ev100: 14, label: 'Hazy sun, soft shadows' },
	overcast: { ev100: 13, label: 'Overcast, shadows barely visible' },
	'heavy-overcast': { ev100: 12, label: 'Heavy overcast, no shadows' },
	'open-shade': { ev100: 11, label: 'Open shade' }
} as const;

export type SkyPreset = keyof typeof SKY_PRESETS;
export const SKY_PRESET_NAMES = Object.keys(SKY_PRESETS) as SkyPreset[];

/** EV = log2(N²/t): the exposure value of a setting. */
export function exposureValue(aperture: number, shutterS: number): number {
	return Math.log2((aperture * aperture) / shutterS);
}

/** EV at ISO 100 from a meter's suggested setting (N, t) at an ISO: log2(N²/t) − log2(ISO/100). */
export function ev100FromMeterReading(aperture: number, shutterS: number, iso = 100): number {
	return exposureValue(aperture, shutterS) - Math.log2(iso / 100);
}

/** EV at ISO 100 from incident illuminance: log2(E · 100 / C) (API: /api/v1/openapi.json). */
export function ev100FromIlluminance(illuminanceLux: number, calibrationC = CALIBRATION_C_FLAT): number {
	return Math.log2((illuminanceLux * 100) / calibrationC);
}

/** Incident illuminance for an EV at ISO 100: E = C · 2^EV / 100. */
export function illuminanceFromEv100(ev100: number, calibrationC = CALIBRATION_C_FLAT): number {
	return (calibrationC * 2 ** ev100) / 100;
}

/** EV at ISO 100 from luminance (reflected reading): log2(L · 100 / K). */
export function ev100FromLuminance(luminanceCdM2: number, calibrationK = CALIBRATION_K_REFLECTED): number {
	return Math.log2((luminanceCdM2 * 100) / calibrationK);
}

export function ev100FromSkyPreset(preset: SkyPreset): number {
	return SKY_PRESETS[preset].ev100;
}

/**
 * Ambient exposure offset in stops (positive = over) at a working aperture (API: /api/v1/openapi.json):
 * ev100 + log2(ISO/100) + log2(t) − 2·log2(N_w) − lossStops.
 */
export function ambientOffsetStops(
	ev100: number,
	iso: number,
	shutterS: number,
	workingF: number,
	lossStops = 0
): number {
	return ev100 + Math.log2(iso / 100) + Math.log2(shutterS) - 2 * Math.log2(workingF) - lossStops;
}

/** Ambient exposure in exposure units (1 = correct): 2^ev100 × (ISO/100) × t / N_w² (API: /api/v1/openapi.json). */
export function ambientExposure(ev100: number, iso: number, shutterS: number, workingF: number): number {
	return (2 ** ev100 * (iso / 100) * shutterS) / (workingF * workingF);
}

/** The shutter time that makes the ambient offset 0: N_w² · 2^lossStops / (2^ev100 · ISO/100). */
export function shutterForCorrect(ev100: number, iso: number, workingF: number, lossStops = 0): number {
	return (workingF * workingF * 2 ** lossStops) / (2 ** ev100 * (iso / 100));
}

/**
 * Flash-to-ambient balance: the shutter time that puts the ambient `stopsUnder` stops below the flash.
 * With the flash itself at `flashOffsetStops` (0 = correct), the ambient should sit at
 * flashOffset − stopsUnder, and each stop is a doubling of the shutter time.
 */
export function shutterForAmbientUnder(
	ev100: number,
	iso: number,
	workingF: number,
	stopsUnder: number,
	lossStops = 0,
	flashOffsetStops = 0
): number {
	return shutterForCorrect(ev100, iso, workingF, lossStops) * 2 ** (flashOffsetStops - stopsUnder);
}

/**
 * Flash and ambient add: with the ambient u stops under the flash, the sum is log2(1 + 2^(−u)) stops
 * above the flash alone (both at "correct", u = 0, is one stop over). The flash compensation that keeps
 * the sum correct is minus that. Source: exposures add linearly (common practice: the fill-flash rule of
 * pulling the flash down when the ambient is near correct).
 */
export function sumAboveFlashStops(stopsUnder: number): number {
	return Math.log2(1 + 2 ** -stopsUnder);
}

export type AmbientSource =
	| { ev100: number }
	| { illuminanceLux: number; calibrationC?: number }
	| { luminanceCdM2: number; calibrationK?: number }
	| { skyPreset: SkyPreset }
	| { meter: { aperture: number; shutter: number; iso: number } };

export interface AmbientCalcInput {
	ev100?: number;
	illuminanceLux?: number;
	calibrationC: number;
	luminanceCdM2?: number;
	calibrationK: number;
	skyPreset?: SkyPreset;
	meter?: { aperture: number; shutter: number; iso: number };
	iso: number;
	aperture: number;
	shutter?: number;
	magnification: number;
	pupilMagnification: number;
	magnificationBy?: MagnificationMethod;
	teleconverterFactor?: number;
	lossStops: number;
	balanceUnderStops?: number;
	flashOffsetStops?: number;
	syncSpeed: number;
}

export interface AmbientCalcResult {
	ev100: number;
	ev100From: 'ev100' | 'illuminance' | 'luminance' | 'skyPreset' | 'meter';
	illuminanceLux: number;
	workingAperture: number;
	exposureOffsetStops?: number;
	shutterForCorrect: number;
	shutterForBalance?: number;
	/** Extra: the nearest marked third-stop speeds (label, exact time, residual stops). */
	markedShutterForCorrect?: ReturnType<typeof nearestMarkedShutter>;
	markedShutterForBalance?: ReturnType<typeof nearestMarkedShutter>;
	/** The balance shutter is faster than the sync speed: a flash cannot sync without high-speed sync. */
	balanceFasterThanSync?: boolean;
	/** Flash and ambient together at the balance shutter, stops against correct (flash at flashOffsetStops). */
	balanceSumOffsetStops?: number;
	/** The flash compensation (stops) that puts flash + ambient at correct, the ambient kept u stops under the flash. */
	flashCompensationStops?: number;
	/** The shutter that keeps the ambient u stops under the flash once that compensation is set. */
	shutterForCompensatedBalance?: number;
}

/** Which of the accepted ambient inputs gives EV at ISO 100. */
export function resolveEv100(input: AmbientCalcInput): { ev100: number; from: AmbientCalcResult['ev100From'] } {
	if (input.ev100 !== undefined) return { ev100: input.ev100, from: 'ev100' };
	if (input.illuminanceLux !== undefined)
		return { ev100: ev100FromIlluminance(input.illuminanceLux, input.calibrationC), from: 'illuminance' };
	if (input.luminanceCdM2 !== undefined)
		return { ev100: ev100FromLuminance(input.luminanceCdM2, input.calibrationK), from: 'luminance' };
	if (input.skyPreset !== undefined) return { ev100: ev100FromSkyPreset(input.skyPreset), from: 'skyPreset' };
	if (input.meter !== undefined)
		return { ev100: ev100FromMeterReading(input.meter.aperture, input.meter.shutter, input.meter.iso), from: 'meter' };
	throw new RangeError('no ambient reading given');
}

/** `POST /api/v1/calc/ambient` (see /api/v1/openapi.json). */
export function ambientCalc(input: AmbientCalcInput): AmbientCalcResult {
	const { ev100, from } = resolveEv100(input);
	const wa = workingApertureOf(input.aperture, input);
	const result: AmbientCalcResult = {
		ev100,
		ev100From: from,
		illuminanceLux: illuminanceFromEv100(ev100, input.calibrationC),
		workingAperture: wa,
		shutterForCorrect: shutterForCorrect(ev100, input.iso, wa, input.lossStops)
	};
	result.markedShutterForCorrect = nearestMarkedShutter(result.shutterForCorrect);
	if (input.shutter !== undefined) {
		result.exposureOffsetStops = ambientOffsetStops(ev100, input.iso, input.shutter, wa, input.lossStops);
	}
	if (input.balanceUnderStops !== undefined) {
		const t = shutterForAmbientUnder(ev100, input.iso, wa, input.balanceUnderStops, input.lossStops, input.flashOffsetStops ?? 0);
		result.shutterForBalance = t;
		result.markedShutterForBalance = nearestMarkedShutter(t);
		result.balanceFasterThanSync = t < input.syncSpeed;
		const sumAbove = sumAboveFlashStops(input.balanceUnderStops);
		result.balanceSumOffsetStops = (input.flashOffsetStops ?? 0) + sumAbove;
		result.flashCompensationStops = -sumAbove;
		result.shutterForCompensatedBalance = shutterForAmbientUnder(ev100, input.iso, wa, input.balanceUnderStops, input.lossStops, -sumAbove);
	}
	return result;
}

/**
 * Marked shutter speeds in third stops, 1/8000 s to 30 s, as cameras label them; the exact times are
 * 2^(k/3) s (k = −39 … 15), e.g. “1/125” is really 2^(−7) = 1/128 s.
 */
const MARKED_SHUTTER_LABELS = [
	'1/8000', '1/6400', '1/5000', '1/4000', '1/3200', '1/2500', '1/2000', '1/1600', '1/1250', '1/1000', '1/800', '1/640',
	'1/500', '1/400', '1/320', '1/250', '1/200', '1/160', '1/125', '1/100', '1/80', '1/60', '1/50', '1/40', '1/30', '1/25',
	'1/20', '1/15', '1/13', '1/10', '1/8', '1/6', '1/5', '1/4', '0.3', '0.4', '0.5', '0.6', '0.8', '1', '1.3', '1.6', '2',
	'2.5', '3.2', '4', '5', '6', '8', '10', '13', '15', '20', '25', '30'
];
export const MARKED_SHUTTER_SPEEDS: readonly { label: string; exactS: number }[] = MARKED_SHUTTER_LABELS.map((label, i) => ({
	label: `${label} s`,
	exactS: 2 ** ((i - 39) / 3)
}));

/** The marked third-stop shutter speed nearest to `shutterS` in stops, and the error it leaves (+ = more light). */
export function nearestMarkedShutter(shutterS: number): { label: string; exactS: number; residualStops: number } {
	const i = Math.min(MARKED_SHUTTER_SPEEDS.length - 1, Math.max(0, Math.round(3 * Math.log2(shutterS) + 39)));
	const step = MARKED_SHUTTER_SPEEDS[i];
	return { ...step, residualStops: Math.log2(step.exactS / shutterS) };
}
