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
import { sourceModelAt } from './extended-source';
import { subjectFaces, type SubjectFaces } from './faces';
import { distanceM, length3, subtract3, type Vec3 } from './geometry';
import { crossingFlag, DEFAULT_SYNC_SPEED_S, emitterSize, lightField, mirrorLanding, subjectFacing, type LightGroup } from './light-field';
import { lowestLadderStep, powerLadder } from './flash';
import { airyDiskUm, apertureFactor, circleOfConfusion, depthOfFieldFromWorkingMm, diffractionLimitWorkingAperture, diffractionSoftensText, type CocSource } from './optics';
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
	/** How the light was modelled at the subject: a point, or a sized source nearer than five sizes. */
	sourceModel?: 'point' | 'disc' | 'rectangle';
	/** With `subject.depthMm`: stops this light gives the subject's front more than its back. */
	depthFalloffStops?: number;
	/** A mirror-like card whose reflection of its source lands off the subject: why it gives nothing. */
	reflectionMissesBy?: number;
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
	/** The face toward the key and the shadow face, what each gets, and their ratio (faces.ts). */
	faces: SubjectFaces | null;
	/** The circle of confusion used and where it came from (given, the sensor, or 0.03 mm). */
	cocMm: number;
	cocFrom: CocSource;
	warnings: string[];
	cautions: string[];
	cautionDetails: ReturnType<typeof sceneCautions>;
}

const stopsOf = (x: number) => (x > 0 ? Math.log2(x) : null);
/** At a vanishing magnification the close-up depth of field has no finite value: say so with null. */
const finiteOrNull = (v: number | null) => (v !== null && Number.isFinite(v) ? v : null);

export function computeExposure(scene: ExposureScene): ExposureResult {
	const cam = scene.camera;
	const { cocMm, from: cocFrom } = circleOfConfusion(cam, DEFAULT_COC_MM);
	const factor = apertureFactor(cam);
	const wavelengthNm = cam.wavelengthNm ?? DEFAULT_WAVELENGTH_NM;
	const sync = cam.syncSpeed ?? DEFAULT_SYNC_SPEED_S;
	const fasterThanSync = cam.shutter < sync;
	const subject = scene.subject.position as Vec3;
	const subjectNormal = subjectFacing(scene);
	const field = lightField(scene);
	const wa = field.workingAperture;
	const depthAxis = depthAxisOf(scene);
	const halfDepthM = (scene.subject.depthMm ?? 0) / 2000;

	const results: SceneLightResult[] = [];
	const unblocked: number[] = []; // each light's X had no flag been in the way (for the blocked-key warning)
	const blockedLights: boolean[] = [];
	const kelvins: (number | undefined)[] = [];
	for (const fl of field.lights) {
		const d = distanceM(fl.position, subject);
		const blockedBy = crossingFlag(fl.position, subject, field.flags);
		const x = fl.xAt(subject, subjectNormal);
		unblocked.push(x);
		blockedLights.push(blockedBy !== undefined);
		const shown = blockedBy ? 0 : x;
		const entry: SceneLightResult = { id: fl.light.id, kind: fl.light.kind, x: shown, stops: stopsOf(shown), blocked: blockedBy !== undefined, group: fl.group, distanceM: d };
		if (blockedBy !== undefined) entry.blockedBy = blockedBy;
		if (fl.sourceBlocked !== undefined) entry.sourceBlocked = fl.sourceBlocked;
		const light = fl.light;
		if (light.kind !== 'reflector') entry.sourceModel = sourceModelAt(emitterSize(light), d);
		if (halfDepthM > 0) {
			const axis = depthAxis ?? towards(subject, fl.position);
			const front = fl.xAt(along(subject, axis, halfDepthM));
			const back = fl.xAt(along(subject, axis, -halfDepthM));
			if (front > 0 && back > 0) entry.depthFalloffStops = Math.log2(front / back);
		}
		if (light.kind === 'reflector' && light.surface === 'specular' && light.normal && light.source !== 'ambient' && x === 0 && !fl.sourceBlocked) {
			const source = scene.lights.find((l) => l.id === light.source)!;
			const n = light.normal as Vec3;
			const landing = mirrorLanding(source.position as Vec3, fl.position, scale(n, 1 / length3(n)), subject);
			entry.reflectionMissesBy = landing ? landing.offsetM - Math.sqrt(light.areaM2 / Math.PI) : -1;
		}
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
		const rowWa = a.exact * factor;
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
			dofMm: finiteOrNull(cam.magnification > 0 ? depthOfFieldFromWorkingMm(rowWa, cam.magnification, cocMm) : null),
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
		const from = diffractionLimitWorkingAperture(cocMm, wavelengthNm) / factor;
		warnings.push(`Diffraction: ${diffractionSoftensText(from, cocMm)}; at ${formatFNumber(wa)} working the Airy disk is ${airyHere.toFixed(0)} µm. Open up, or stack frames at a wider aperture.`);
	}
	for (const f of flashes) {
		if (f.lowestPower === undefined) continue;
		const lowest = powerLadder[lowestLadderStep(f.lowestPower)];
		if (f.power < lowest.fraction * (1 - 1e-9)) {
			warnings.push(`Flash “${f.id}” is set below its lowest step (${lowest.label}): it cannot give that little. Move it back, add diffusion or stop down.`);
		}
	}
	for (const r of results) {
		if (r.reflectionMissesBy === undefined) continue;
		warnings.push(
			r.reflectionMissesBy < 0
				? `Mirror-like reflector “${r.id}” faces away from its source or the subject: it returns nothing here.`
				: `Mirror-like reflector “${r.id}”: the reflection of its source lands ${formatDistanceM(r.reflectionMissesBy)} beyond its edge, so it misses the subject and adds nothing. Turn it until the reflection falls on the subject.`
		);
	}
	const shareByKelvin = results
		.map((r, i) => ({ kelvin: kelvins[i], share: r.x }))
		.filter((s): s is { kelvin: number; share: number } => s.kelvin !== undefined);
	const whiteBalance = shareByKelvin.length ? mixedWhiteBalance(shareByKelvin) : null;
	if (whiteBalance?.mixed) warnings.push(mixedLightWarning(whiteBalance));

	const cautionDetails = sceneCautions(scene);
	// The faces' key is the strongest light as a surface turned to it would get it: a key at 90° to the
	// camera gives the camera-facing side nothing, yet it is still the light that models the subject.
	let faceKey = -1;
	let faceKeyX = 0;
	field.lights.forEach((l, i) => {
		const x = blockedLights[i] ? 0 : subjectNormal ? l.xAt(subject) : unblocked[i];
		if (x > faceKeyX) [faceKey, faceKeyX] = [i, x];
	});
	const faces = faceKey >= 0 ? subjectFaces(field, subject, faceKey, subjectNormal, blockedLights) : null;
	return {
		workingAperture: wa,
		lights: results,
		total: { x: totalX, exposureOffsetStops: totalStops },
		keyLightId: key?.id ?? null,
		lightingRatio,
		apertureTable,
		whiteBalance,
		faces,
		cocMm,
		cocFrom,
		warnings,
		cautions: cautionDetails.map((c) => c.message),
		cautionDetails
	};
}

const scale = (v: Vec3, k: number): Vec3 => [v[0] * k, v[1] * k, v[2] * k];
const along = (p: Vec3, axis: Vec3, m: number): Vec3 => [p[0] + axis[0] * m, p[1] + axis[1] * m, p[2] + axis[2] * m];
const towards = (from: Vec3, to: Vec3): Vec3 => {
	const v = subtract3(to, from);
	return scale(v, 1 / length3(v));
};
const formatDistanceM = (m: number) => (m < 1 ? `${Math.round(m * 100)} cm` : `${m.toFixed(2)} m`);

/**
 * The axis the subject's depth lies along: from its back toward the camera (its front), when the camera
 * has a position; else undefined, and each light measures along its own direction (the most it can lose).
 */
function depthAxisOf(scene: ExposureScene): Vec3 | undefined {
	const cam = scene.camera.position as Vec3 | undefined;
	if (!cam) return undefined;
	const v = subtract3(cam, scene.subject.position as Vec3);
	const l = length3(v);
	return l > 0 ? scale(v, 1 / l) : undefined;
}
