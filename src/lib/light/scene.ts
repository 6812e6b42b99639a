/**
 * The whole `POST /api/v1/exposure` computation (/api/v1/openapi.json): every light's exposure at the subject, the
 * total, the key light and lighting ratio, the aperture table, warnings and cautions. What each light
 * gives is worked out by `lightField` (light-field.ts, with the formulas); this file reads it at the
 * subject. Where X is 0 (blocked, facing away), stops is null: JSON has no −Infinity.
 */
import { sceneCautions } from './cautions';
import { mixedLightWarning, mixedWhiteBalance, type WhiteBalanceMix } from './colour';
import { highSpeedSyncFactor, HSS_ENTRY_LOSS_STOPS } from './flash';
import { formatFNumber, formatShutter, formatStops } from './format';
import { distanceM, type Vec3 } from './geometry';
import { crossingFlag, DEFAULT_SYNC_SPEED_S, lightField, type LightGroup } from './light-field';
import { airyDiskUm, closeUpDepthOfFieldMm, workingAperture } from './optics';
import type { ExposureScene, FlashLight, SceneLight } from './schema';

export type { LightGroup } from './light-field';
export const DEFAULT_MIN_APERTURE = 2.8;
export const DEFAULT_MAX_APERTURE = 32;
export const DEFAULT_COC_MM = 0.03;
export const DEFAULT_WAVELENGTH_NM = 550;
export const EXPOSURE_WARNING_STOPS = 3;

/**
 * Third-stop marked apertures: the nominal labels and the exact values 2^(k/6). The API's series runs
 * from 2.8 (k = 9) to 45 (k = 33); it is extended down to f/1 and up to f/64 for cameras set outside it.
 */
const NOMINAL_APERTURES = [
	1, 1.1, 1.2, 1.4, 1.6, 1.8, 2, 2.2, 2.5, 2.8, 3.2, 3.5, 4, 4.5, 5, 5.6, 6.3, 7.1, 8, 9, 10, 11, 13, 14, 16, 18, 20,
	22, 25, 29, 32, 36, 40, 45, 51, 57, 64
];
export const THIRD_STOP_APERTURES: readonly { k: number; nominal: number; exact: number; label: string }[] =
	NOMINAL_APERTURES.map((nominal, k) => ({ k, nominal, exact: 2 ** (k / 6), label: `f/${nominal}` }));

export interface SceneLightResult {
	id: string;
	kind: SceneLight['kind'] | 'ambient';
	x: number;
	stops: number | null;
	/** The straight path to the subject crosses a flag (in plan). */
	blocked: boolean;
	blockedBy?: string;
	/** A reflector whose source is flagged off from it (unlit). */
	sourceBlocked?: boolean;
	/** Flash-timed light (flashes and their reflectors) or shutter-timed light (ambient, continuous). */
	group: LightGroup;
	distanceM?: number;
}

export interface ApertureRow {
	aperture: number;
	label: string;
	workingAperture: number;
	exposureOffsetStops: number | null;
	flashOffsetStops: number | null;
	ambientOffsetStops: number | null;
	dofMm: number | null;
	airyDiskUm: number;
	diffractionLimited: boolean;
}

export interface ExposureResult {
	workingAperture: number;
	lights: SceneLightResult[];
	total: { x: number; exposureOffsetStops: number | null };
	keyLightId: string | null;
	lightingRatio: number | null;
	apertureTable: ApertureRow[];
	whiteBalance: WhiteBalanceMix | null;
	warnings: string[];
	cautions: string[];
	cautionDetails: ReturnType<typeof sceneCautions>;
}

const stopsOf = (x: number) => (x > 0 ? Math.log2(x) : null);
/** At a vanishing magnification the close-up depth of field has no finite value: say so with null. */
const finiteOrNull = (v: number | null) => (v !== null && Number.isFinite(v) ? v : null);

export function computeExposure(scene: ExposureScene): ExposureResult {
	const cam = scene.camera;
	const pupilMagnification = cam.pupilMagnification ?? 1;
	const cocMm = cam.cocMm ?? DEFAULT_COC_MM;
	const wavelengthNm = cam.wavelengthNm ?? DEFAULT_WAVELENGTH_NM;
	const sync = cam.syncSpeed ?? DEFAULT_SYNC_SPEED_S;
	const fasterThanSync = cam.shutter < sync;
	const subject = scene.subject.position as Vec3;
	const subjectNormal = scene.subject.normal as Vec3 | undefined;
	const field = lightField(scene);
	const wa = field.workingAperture;

	const results: SceneLightResult[] = [];
	const unblocked: number[] = []; // each light's X had no flag been in the way (for the blocked-key warning)
	const kelvins: (number | undefined)[] = [];
	for (const fl of field.lights) {
		const d = distanceM(fl.position, subject);
		const blockedBy = crossingFlag(fl.position, subject, field.flags);
		const x = fl.xAt(subject, subjectNormal);
		unblocked.push(x);
		const shown = blockedBy ? 0 : x;
		const entry: SceneLightResult = { id: fl.light.id, kind: fl.light.kind, x: shown, stops: stopsOf(shown), blocked: blockedBy !== undefined, group: fl.group, distanceM: d };
		if (blockedBy !== undefined) entry.blockedBy = blockedBy;
		if (fl.sourceBlocked !== undefined) entry.sourceBlocked = fl.sourceBlocked;
		results.push(entry);
		kelvins.push(fl.kelvin);
	}
	if (scene.ambient) {
		const x = field.ambientX;
		results.push({ id: 'ambient', kind: 'ambient', x, stops: stopsOf(x), blocked: false, group: 'ambient' });
		unblocked.push(x);
		kelvins.push(scene.ambient.kelvin);
	}

	const totalX = results.reduce((s, r) => s + r.x, 0);
	const flashX = results.filter((r) => r.group === 'flash').reduce((s, r) => s + r.x, 0);
	const shutterX = totalX - flashX;

	const ranked = [...results].sort((a, b) => b.x - a.x);
	const key = ranked[0] && ranked[0].x > 0 ? ranked[0] : undefined;
	const runnerUp = ranked[1];
	const lightingRatio = key && runnerUp && runnerUp.x > 0 ? key.x / runnerUp.x : null;

	// The aperture table: every contribution scales with 1/N_w², so a row's stops are the stops at the
	// camera's aperture plus 2·log2(N_w / N_w,row).
	const totalStops = stopsOf(totalX);
	const flashStops = stopsOf(flashX);
	const shutterStops = stopsOf(shutterX);
	const minAperture = cam.minAperture ?? DEFAULT_MIN_APERTURE;
	const maxAperture = cam.maxAperture ?? DEFAULT_MAX_APERTURE;
	const tol = 1e-9;
	const apertureTable = THIRD_STOP_APERTURES.filter(
		(a) => a.nominal >= minAperture * (1 - tol) - 0.001 && a.nominal <= maxAperture * (1 + tol) + 0.001
	).map((a): ApertureRow => {
		const rowWa = workingAperture(a.exact, cam.magnification, pupilMagnification);
		const shiftStops = 2 * Math.log2(wa / rowWa);
		const shifted = (stops: number | null) => (stops === null ? null : stops + shiftStops);
		const airy = airyDiskUm(rowWa, wavelengthNm);
		return {
			aperture: a.exact,
			label: a.label,
			workingAperture: rowWa,
			exposureOffsetStops: shifted(totalStops),
			flashOffsetStops: shifted(flashStops),
			ambientOffsetStops: shifted(shutterStops),
			dofMm: finiteOrNull(cam.magnification > 0 ? closeUpDepthOfFieldMm(a.exact, cam.magnification, cocMm, pupilMagnification) : null),
			airyDiskUm: airy,
			diffractionLimited: airy > cocMm * 1000
		};
	});

	const warnings: string[] = [];
	const flashes = scene.lights.filter((l): l is FlashLight => l.kind === 'flash');
	if (flashes.length && fasterThanSync) {
		const hss = flashes.filter((f) => f.highSpeedSync).map((f) => f.id);
		const plain = flashes.filter((f) => !f.highSpeedSync).map((f) => f.id);
		const head = `Shutter ${formatShutter(cam.shutter)} is faster than the sync speed ${formatShutter(sync)}`;
		if (plain.length) {
			warnings.push(`${head}: flash ${plain.map((id) => `“${id}”`).join(', ')} will light only part of the frame. Use ${formatShutter(sync)} or slower, or high-speed sync.`);
		}
		if (hss.length) {
			const cost = -Math.log2(highSpeedSyncFactor(cam.shutter, sync));
			warnings.push(`${head}: high-speed sync on ${hss.map((id) => `“${id}”`).join(', ')} costs about ${cost.toFixed(1)} stops (${HSS_ENTRY_LOSS_STOPS} stop for pulsed output plus the shutter's share of the slit travel; the flash's manual has the real figure).`);
		}
	}
	if (totalStops === null) {
		warnings.push('No light reaches the subject.');
	} else if (Math.abs(totalStops) > EXPOSURE_WARNING_STOPS) {
		warnings.push(`The exposure is ${formatStops(totalStops)} at ${formatFNumber(cam.aperture)}: more than ${EXPOSURE_WARNING_STOPS} stops ${totalStops > 0 ? 'over' : 'under'}.`);
	}
	let strongest = -1;
	for (let i = 0; i < results.length; i++) if (strongest < 0 || unblocked[i] > unblocked[strongest]) strongest = i;
	const unblockedKey = strongest >= 0 && unblocked[strongest] > 0 ? results[strongest] : undefined;
	if (unblockedKey?.blocked) {
		warnings.push(`The key light “${unblockedKey.id}” is blocked by flag “${unblockedKey.blockedBy}”.`);
	}
	const airyHere = airyDiskUm(wa, wavelengthNm);
	if (airyHere > cocMm * 1000) {
		warnings.push(`Diffraction: at ${formatFNumber(wa)} working the Airy disk is ${airyHere.toFixed(0)} µm, larger than the ${(cocMm * 1000).toFixed(0)} µm circle of confusion. Open up or accept softer detail.`);
	}
	const shareByKelvin = results
		.map((r, i) => ({ kelvin: kelvins[i], share: r.x }))
		.filter((s): s is { kelvin: number; share: number } => s.kelvin !== undefined);
	const whiteBalance = shareByKelvin.length ? mixedWhiteBalance(shareByKelvin) : null;
	if (whiteBalance?.mixed) warnings.push(mixedLightWarning(whiteBalance));

	const cautionDetails = sceneCautions(scene);
	return {
		workingAperture: wa,
		lights: results,
		total: { x: totalX, exposureOffsetStops: totalStops },
		keyLightId: key?.id ?? null,
		lightingRatio,
		apertureTable,
		whiteBalance,
		warnings,
		cautions: cautionDetails.map((c) => c.message),
		cautionDetails
	};
}
