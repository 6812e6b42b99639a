/**
 * The whole `POST /api/v1/exposure` computation (/api/v1/openapi.json): every light's exposure at the subject, the
 * total, the key light and lighting ratio, the aperture table, warnings and cautions.
 *
 * Exposure units: X = 1 is a correct exposure at the working aperture; stops = log2(X).
 *   flash:      X = (GN_eff / (d · N_w))²
 *   continuous: X = luxAt1m / d² × ISO × t / (C · N_w²), C = 250, losses applied
 *   ambient:    X = 2^ev100 × (ISO/100) × t / N_w²
 *   diffuse reflector (a Lambertian disc of the same area, r = √(A/π)):
 *               X = ρ · X_at_card · cos θ_in · cos θ_out · r² / (r² + d₂²)
 *   specular reflector: ρ × the source's X at the path d₁ + d₂ (ambient source: ρ × ambient X)
 * Camera `lossStops` scale every light. A flag crossing a path in plan (x, y) stops that light.
 * Where X is 0 (blocked, facing away), stops is null: JSON has no −Infinity.
 */
import { ambientExposure } from './ambient';
import { sceneCautions } from './cautions';
import { mixedLightWarning, mixedWhiteBalance, gelledKelvin, type WhiteBalanceMix } from './colour';
import { effectiveGuideNumber, flashExposure, highSpeedSyncFactor, HSS_ENTRY_LOSS_STOPS } from './flash';
import { formatFNumber, formatShutter, formatStops } from './format';
import {
	angleBetweenDeg,
	beamFactor,
	distanceM,
	facingCosine,
	plan,
	segmentsIntersect,
	subtract3,
	type Vec3
} from './geometry';
import { airyDiskUm, closeUpDepthOfFieldMm, workingAperture } from './optics';
import type { ContinuousLight, ExposureScene, FlashLight, Flag, SceneLight } from './schema';

export const CONTINUOUS_CALIBRATION_C = 250;
/** Beam angle assumed for a light given an `aim` but no beam angle (ours: a bare small flash head). */
export const DEFAULT_BEAM_ANGLE_DEG = 60;
export const DEFAULT_SYNC_SPEED_S = 1 / 200;
export const DEFAULT_MIN_APERTURE = 2.8;
export const DEFAULT_MAX_APERTURE = 32;
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

export type LightGroup = 'flash' | 'ambient';

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

function crossingFlag(a: Vec3, b: Vec3, flags: readonly Flag[]): string | undefined {
	const pa = plan(a);
	const pb = plan(b);
	return flags.find((f) => segmentsIntersect(pa, pb, f.from, f.to))?.id;
}

/**
 * The camera-only columns of one aperture-table row: they depend on the lens settings alone, not on the
 * lights, so a scene whose lights move (as in the editor) reuses them. `shiftStops` = 2·log2(N_w / N_w,row)
 * is what every light's stops gain at this row against the camera's own aperture.
 */
export interface ApertureColumns {
	readonly aperture: number;
	readonly label: string;
	readonly workingAperture: number;
	readonly shiftStops: number;
	readonly dofMm: number | null;
	readonly airyDiskUm: number;
	readonly diffractionLimited: boolean;
}

/** Everything of the answer but the aperture table, and what the table is made of. */
export interface ExposureParts {
	answer: Omit<ExposureResult, 'apertureTable'>;
	columns: readonly ApertureColumns[];
	totalStops: number | null;
	flashStops: number | null;
	shutterStops: number | null;
}

type Camera = ExposureScene['camera'];

/** The lens settings the aperture table depends on, with their defaults filled in. */
export interface LensSettings {
	aperture: number;
	magnification: number;
	pupil: number;
	coc: number;
	lambda: number;
	minA: number;
	maxA: number;
}

export const lensSettings = (cam: Camera): LensSettings => ({
	aperture: cam.aperture,
	magnification: cam.magnification,
	pupil: cam.pupilMagnification ?? 1,
	coc: cam.cocMm ?? 0.03,
	lambda: cam.wavelengthNm ?? 550,
	minA: cam.minAperture ?? DEFAULT_MIN_APERTURE,
	maxA: cam.maxAperture ?? DEFAULT_MAX_APERTURE
});

/** The last few lens settings seen, newest first: a handful of cameras at once, compared field by field. */
const recentColumns: { lens: LensSettings; columns: readonly ApertureColumns[] }[] = [];
export const COLUMN_MEMO_SIZE = 8;

/** The aperture table's camera-only columns for these lens settings, memoised. */
export function apertureColumns(lens: LensSettings): readonly ApertureColumns[] {
	for (const { lens: m, columns } of recentColumns) {
		if (
			m.aperture === lens.aperture &&
			m.magnification === lens.magnification &&
			m.pupil === lens.pupil &&
			m.coc === lens.coc &&
			m.lambda === lens.lambda &&
			m.minA === lens.minA &&
			m.maxA === lens.maxA
		) {
			return columns;
		}
	}
	const columns = buildApertureColumns(lens);
	recentColumns.unshift({ lens, columns });
	if (recentColumns.length > COLUMN_MEMO_SIZE) recentColumns.pop();
	return columns;
}

/** `apertureColumns` without the memo. */
export function buildApertureColumns(lens: LensSettings): readonly ApertureColumns[] {
	const { magnification, pupil, coc, lambda, minA, maxA } = lens;
	const wa = workingAperture(lens.aperture, magnification, pupil);
	const tol = 1e-9;
	const columns = THIRD_STOP_APERTURES.filter(
		(a) => a.nominal >= minA * (1 - tol) - 0.001 && a.nominal <= maxA * (1 + tol) + 0.001
	).map((a): ApertureColumns => {
		const rowWa = workingAperture(a.exact, magnification, pupil);
		const airy = airyDiskUm(rowWa, lambda);
		return Object.freeze({
			aperture: a.exact,
			label: a.label,
			workingAperture: rowWa,
			shiftStops: 2 * Math.log2(wa / rowWa),
			dofMm: finiteOrNull(magnification > 0 ? closeUpDepthOfFieldMm(a.exact, magnification, coc, pupil) : null),
			airyDiskUm: airy,
			diffractionLimited: airy > coc * 1000
		});
	});
	return Object.freeze(columns);
}

/** The whole computation; `computeExposure` assembles the answer from it, the exposure route writes it. */
export function exposureParts(scene: ExposureScene): ExposureParts {
	const cam = scene.camera;
	const lens = lensSettings(cam);
	const { pupil: P, coc, lambda } = lens;
	const sync = cam.syncSpeed ?? DEFAULT_SYNC_SPEED_S;
	const wa = workingAperture(cam.aperture, cam.magnification, P);
	const cameraFactor = 2 ** -(cam.lossStops ?? 0);
	const subject = scene.subject.position as Vec3;
	const flags = scene.flags ?? [];
	const fasterThanSync = cam.shutter < sync;
	const byId = new Map(scene.lights.map((l) => [l.id, l]));

	/** Angular share of an emitter's output toward a point (1 when it has no beam). */
	const beamToward = (light: FlashLight | ContinuousLight, point: Vec3) => {
		if (light.aim === undefined && light.beamAngleDeg === undefined) return 1;
		const pos = light.position as Vec3;
		const axis = subtract3((light.aim ?? subject) as Vec3, pos);
		return beamFactor(angleBetweenDeg(axis, subtract3(point, pos)), light.beamAngleDeg ?? DEFAULT_BEAM_ANGLE_DEG);
	};
	/** An emitter's X at a distance along a direction with angular factor `beam` (before camera loss). */
	const emitterX = (light: FlashLight | ContinuousLight, dM: number, beam: number) => {
		if (light.kind === 'flash') {
			const gn = effectiveGuideNumber({ guideNumber: light.guideNumber, iso: cam.iso, power: light.power, lossStops: light.lossStops ?? 0 });
			const hss = light.highSpeedSync && fasterThanSync ? highSpeedSyncFactor(cam.shutter, sync) : 1;
			return beam * hss * flashExposure(gn, dM, wa);
		}
		const lux = (light.luxAt1m * 2 ** -(light.lossStops ?? 0)) / (dM * dM);
		return (beam * lux * cam.iso * cam.shutter) / (CONTINUOUS_CALIBRATION_C * wa * wa);
	};
	const subjectCosine = (from: Vec3) =>
		scene.subject.normal ? facingCosine(scene.subject.normal as Vec3, subtract3(from, subject)) : 1;
	const ambientX = scene.ambient ? ambientExposure(scene.ambient.ev100, cam.iso, cam.shutter, wa) : 0;

	const results: SceneLightResult[] = [];
	const unblocked: number[] = []; // each light's X had no flag been in the way (for the blocked-key warning)
	const kelvins: { kelvin: number | undefined; id: string }[] = [];
	const lightKelvin = (l: FlashLight | ContinuousLight) =>
		l.kelvin === undefined ? undefined : l.gelMired ? gelledKelvin(l.kelvin, l.gelMired) : l.kelvin;

	for (const light of scene.lights) {
		const pos = light.position as Vec3;
		const d = distanceM(pos, subject);
		const blockedBy = crossingFlag(pos, subject, flags);
		let x: number;
		let group: LightGroup;
		let sourceBlocked: boolean | undefined;
		if (light.kind !== 'reflector') {
			x = emitterX(light, d, beamToward(light, subject)) * subjectCosine(pos);
			group = light.kind === 'flash' ? 'flash' : 'ambient';
			kelvins.push({ kelvin: lightKelvin(light), id: light.id });
		} else {
			const r2 = light.areaM2 / Math.PI;
			const n = light.normal as Vec3 | undefined;
			const cosOut = n ? facingCosine(n, subtract3(subject, pos)) : 1;
			const rho = light.reflectance;
			if (light.source === 'ambient') {
				group = 'ambient';
				kelvins.push({ kelvin: scene.ambient?.kelvin, id: light.id });
				if (light.surface === 'diffuse') x = rho * ambientX * cosOut * (r2 / (r2 + d * d));
				else x = cosOut > 0 ? rho * ambientX : 0;
			} else {
				// The schema guarantees the source exists and is an emitter.
				const source = byId.get(light.source) as FlashLight | ContinuousLight;
				const sPos = source.position as Vec3;
				const d1 = distanceM(sPos, pos);
				const cosIn = n ? facingCosine(n, subtract3(sPos, pos)) : 1;
				group = source.kind === 'flash' ? 'flash' : 'ambient';
				kelvins.push({ kelvin: lightKelvin(source), id: light.id });
				sourceBlocked = crossingFlag(sPos, pos, flags) !== undefined;
				const beam = beamToward(source, pos);
				if (light.surface === 'diffuse') {
					x = rho * emitterX(source, d1, beam) * cosIn * cosOut * (r2 / (r2 + d * d));
				} else {
					x = cosIn > 0 && cosOut > 0 ? rho * emitterX(source, d1 + d, beam) : 0;
				}
				if (sourceBlocked) x = 0;
			}
			x *= subjectCosine(pos);
		}
		x *= cameraFactor;
		unblocked.push(x);
		if (blockedBy) x = 0;
		const entry: SceneLightResult = { id: light.id, kind: light.kind, x, stops: stopsOf(x), blocked: blockedBy !== undefined, group, distanceM: d };
		if (blockedBy !== undefined) entry.blockedBy = blockedBy;
		if (sourceBlocked !== undefined) entry.sourceBlocked = sourceBlocked;
		results.push(entry);
	}
	if (scene.ambient) {
		const x = ambientX * cameraFactor;
		results.push({ id: 'ambient', kind: 'ambient', x, stops: stopsOf(x), blocked: false, group: 'ambient' });
		unblocked.push(x);
		kelvins.push({ kelvin: scene.ambient.kelvin, id: 'ambient' });
	}

	const totalX = results.reduce((s, r) => s + r.x, 0);
	const flashX = results.filter((r) => r.group === 'flash').reduce((s, r) => s + r.x, 0);
	const shutterX = totalX - flashX;

	const ranked = [...results].sort((a, b) => b.x - a.x);
	const key = ranked[0] && ranked[0].x > 0 ? ranked[0] : undefined;
	const runnerUp = ranked[1];
	const lightingRatio = key && runnerUp && runnerUp.x > 0 ? key.x / runnerUp.x : null;

	// The aperture table: every contribution scales with 1/N_w², so each row shifts the totals' stops by
	// the row's own `shiftStops`; its camera-only columns come from `apertureColumns`.
	const columns = apertureColumns(lens);
	const totalStops = stopsOf(totalX);
	const flashStops = stopsOf(flashX);
	const shutterStops = stopsOf(shutterX);

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
	const airyHere = airyDiskUm(wa, lambda);
	if (airyHere > coc * 1000) {
		warnings.push(`Diffraction: at ${formatFNumber(wa)} working the Airy disk is ${airyHere.toFixed(0)} µm, larger than the ${(coc * 1000).toFixed(0)} µm circle of confusion. Open up or accept softer detail.`);
	}
	const shareByKelvin = results
		.map((r, i) => ({ kelvin: kelvins[i]?.kelvin, share: r.x }))
		.filter((s): s is { kelvin: number; share: number } => s.kelvin !== undefined);
	const whiteBalance = shareByKelvin.length ? mixedWhiteBalance(shareByKelvin) : null;
	if (whiteBalance?.mixed) warnings.push(mixedLightWarning(whiteBalance));

	const cautionDetails = sceneCautions(scene);
	return {
		answer: {
			workingAperture: wa,
			lights: results,
			total: { x: totalX, exposureOffsetStops: totalStops },
			keyLightId: key?.id ?? null,
			lightingRatio,
			whiteBalance,
			warnings,
			cautions: cautionDetails.map((c) => c.message),
			cautionDetails
		},
		columns,
		totalStops,
		flashStops,
		shutterStops
	};
}

/**
 * The aperture table gives its stops to a millionth of a stop: far finer than any meter or eye, and the
 * shorter numbers are much quicker to write as text (a table is 66 of them on every request).
 */
export const TABLE_STOPS_DECIMALS = 6;
const TABLE_STOPS_SCALE = 10 ** TABLE_STOPS_DECIMALS;

/** A row's stops: the light's stops at the camera's aperture moved by the row's shift (null stays null). */
export const shifted = (stops: number | null, shiftStops: number) =>
	stops === null ? null : Math.round((stops + shiftStops) * TABLE_STOPS_SCALE) / TABLE_STOPS_SCALE;

export function computeExposure(scene: ExposureScene): ExposureResult {
	const { answer, columns, totalStops, flashStops, shutterStops } = exposureParts(scene);
	const apertureTable: ApertureRow[] = columns.map((c) => ({
		aperture: c.aperture,
		label: c.label,
		workingAperture: c.workingAperture,
		exposureOffsetStops: shifted(totalStops, c.shiftStops),
		flashOffsetStops: shifted(flashStops, c.shiftStops),
		ambientOffsetStops: shifted(shutterStops, c.shiftStops),
		dofMm: c.dofMm,
		airyDiskUm: c.airyDiskUm,
		diffractionLimited: c.diffractionLimited
	}));
	const { workingAperture, lights, total, keyLightId, lightingRatio, whiteBalance, warnings, cautions, cautionDetails } = answer;
	return { workingAperture, lights, total, keyLightId, lightingRatio, apertureTable, whiteBalance, warnings, cautions, cautionDetails };
}
