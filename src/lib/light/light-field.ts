/**
 * The light of a scene at any point: what each light gives a surface there, in exposure units. The
 * exposure route asks it at the subject (`computeExposure` in scene.ts); the editor's falloff map asks
 * it at every cell of the table, so the map at the subject is exactly the exposure the engine reports.
 *
 * Exposure units: X = 1 is a correct exposure at the working aperture; stops = log2(X).
 *   flash:      X = (GN_eff / (d · N_w))²
 *   continuous: X = luxAt1m / d² × ISO × t / (C · N_w²), C = 250, losses applied
 *   ambient:    X = 2^ev100 × (ISO/100) × t / N_w²
 *   diffuse reflector (a Lambertian disc of the same area, r = √(A/π)):
 *               X = ρ · X_at_card · cos θ_in · cos θ_out · r² / (r² + d₂²)
 *   specular reflector: ρ × the source's X at the path d₁ + d₂ (ambient source: ρ × ambient X); with a
 *               `normal`, only where the mirror reflection of the source lands on the point within the
 *               card's extent (a disc of its area), at the reflected path's length
 * N_w from how the magnification is made (optics.ts, `apertureFactor`); a flash's measured calibration
 * scales its guide number; a light with a size is an extended source nearer than five sizes
 * (extended-source.ts). Lambert's cosine law at the surface when it has a normal; camera `lossStops`
 * scale every light. A flag crossing a path in plan (x, y) stops that light. Lights keep their aim
 * wherever the point is.
 */
import { ambientExposure } from './ambient';
import { gelledKelvin } from './colour';
import { effectiveGuideNumber, flashExposure, highSpeedSyncFactor } from './flash';
import { sizedSourceFactor, type EmitterSize } from './extended-source';
import { beamExponent, beamFactorFromCosine, distanceM, dot3, facingCosine, length3, segmentsIntersect, subtract3, type Vec3 } from './geometry';
import { workingApertureOf } from './optics';
import type { ContinuousLight, ExposureScene, Flag, FlashLight, SceneLight } from './schema';

export const CONTINUOUS_CALIBRATION_C = 250;
/** Beam angle assumed for a light given an `aim` but no beam angle (ours: a bare small flash head). */
export const DEFAULT_BEAM_ANGLE_DEG = 60;
export const DEFAULT_SYNC_SPEED_S = 1 / 200;
/**
 * The scene's rules keep every emitter at least 1 mm from the subject; a point nearer than that (a
 * falloff-map cell on top of a lamp) counts as 1 mm away rather than infinitely bright.
 */
export const MIN_EMITTER_DISTANCE_M = 0.001;

export type LightGroup = 'flash' | 'ambient';
type Emitter = FlashLight | ContinuousLight;

export interface FieldLight {
	light: SceneLight;
	position: Vec3;
	/** Flash-timed light (flashes and their reflectors) or shutter-timed light (ambient, continuous). */
	group: LightGroup;
	/** The light's colour: its own kelvin (gelled), or its source's for a card; undefined when not given. */
	kelvin: number | undefined;
	/** A reflector whose source is flagged off from it (unlit); undefined for an emitter. */
	sourceBlocked?: boolean;
	/**
	 * X this light gives a surface at `point` facing `normal` (any surface: none given), camera loss
	 * included; a flag between the light and the point is not looked at here (see `crossingFlag`).
	 */
	xAt(point: Vec3, normal?: Vec3): number;
}

export interface LightField {
	workingAperture: number;
	/** The ambient's X, camera loss included (0 without ambient). */
	ambientX: number;
	lights: FieldLight[];
	flags: readonly Flag[];
}

/** A light's face when it has one (the scene's emitter size fields), else undefined: a point. */
export function emitterSize(light: Emitter): EmitterSize | undefined {
	if (light.emitterDiameterM !== undefined) return { shape: 'disc', diameterM: light.emitterDiameterM };
	if (light.emitterWidthM !== undefined && light.emitterHeightM !== undefined) {
		return { shape: 'rectangle', widthM: light.emitterWidthM, heightM: light.emitterHeightM };
	}
	return undefined;
}

const unit3 = (v: Vec3): Vec3 | undefined => {
	const l = length3(v);
	return l > 1e-12 ? [v[0] / l, v[1] / l, v[2] / l] : undefined;
};

/**
 * Which way the subject's face looks: its `normal`; else up for `facing: "up"` (a face-up section);
 * else toward the camera when the camera has a position. Undefined (no cosine: the face turned to each
 * light, the API's original rule) when none of these is known.
 */
export function subjectFacing(scene: ExposureScene): Vec3 | undefined {
	const s = scene.subject;
	if (s.normal) return s.normal as Vec3;
	if (s.facing === 'up') return [0, 0, 1];
	const cam = scene.camera.position as Vec3 | undefined;
	return cam ? unit3(subtract3(cam, s.position as Vec3)) : undefined;
}

/**
 * Where the mirror reflection of `source` in a flat card (centre `card`, unit normal `n`, radius
 * `radiusM`) toward `point` meets the card's plane, and how far that is from the card's centre; the
 * reflected path's length is |source′ − point|, source′ the source's mirror image. Null when source
 * and point are not both in front of the card.
 */
export function mirrorLanding(source: Vec3, card: Vec3, n: Vec3, point: Vec3): { offsetM: number; pathM: number } | null {
	const sHeight = dot3(subtract3(source, card), n);
	const pHeight = dot3(subtract3(point, card), n);
	if (sHeight <= 0 || pHeight <= 0) return null;
	const image: Vec3 = [source[0] - 2 * sHeight * n[0], source[1] - 2 * sHeight * n[1], source[2] - 2 * sHeight * n[2]];
	// The segment image → point crosses the plane at t = sHeight / (sHeight + pHeight) from the image.
	const t = sHeight / (sHeight + pHeight);
	const hit: Vec3 = [image[0] + t * (point[0] - image[0]), image[1] + t * (point[1] - image[1]), image[2] + t * (point[2] - image[2])];
	return { offsetM: distanceM(hit, card), pathM: distanceM(image, point) };
}

/** The first flag whose plan segment crosses the path a–b, by id. */
export function crossingFlag(a: Vec3, b: Vec3, flags: readonly Flag[]): string | undefined {
	for (const f of flags) if (segmentsIntersect(a, b, f.from, f.to)) return f.id;
	return undefined;
}

/** Works out, once per scene, everything that does not depend on where the light is measured. */
export function lightField(scene: ExposureScene): LightField {
	const cam = scene.camera;
	const sync = cam.syncSpeed ?? DEFAULT_SYNC_SPEED_S;
	const wa = workingApertureOf(cam.aperture, cam);
	const cameraFactor = 2 ** -(cam.lossStops ?? 0);
	const subject = scene.subject.position as Vec3;
	const flags = scene.flags ?? [];
	const fasterThanSync = cam.shutter < sync;
	const byId = new Map(scene.lights.map((l) => [l.id, l]));
	const ambientX = scene.ambient ? ambientExposure(scene.ambient.ev100, cam.iso, cam.shutter, wa) : 0;

	/**
	 * An emitter's angular share toward a point (geometry.ts's beamFactor): 1 when it has no beam; its
	 * axis points at its aim, else at the subject.
	 */
	const beamOf = (light: Emitter): ((point: Vec3) => number) => {
		if (light.aim === undefined && light.beamAngleDeg === undefined) return () => 1;
		const pos = light.position as Vec3;
		const axis = subtract3((light.aim ?? subject) as Vec3, pos);
		const axisLength = length3(axis);
		const exponent = beamExponent(light.beamAngleDeg ?? DEFAULT_BEAM_ANGLE_DEG);
		return (point) => {
			const toPoint = subtract3(point, pos);
			const lengths = axisLength * length3(toPoint);
			return lengths === 0 ? 1 : beamFactorFromCosine(dot3(axis, toPoint) / lengths, exponent);
		};
	};
	/** An emitter's X at a distance along a direction with angular factor `beam` (before camera loss). */
	const emitterXOf = (light: Emitter): ((dM: number, beam: number) => number) => {
		const size = emitterSize(light);
		const sized = size ? (dM: number) => sizedSourceFactor(size, dM) : () => 1;
		if (light.kind === 'flash') {
			const gn = effectiveGuideNumber({
				guideNumber: light.guideNumber,
				iso: cam.iso,
				power: light.power,
				lossStops: light.lossStops ?? 0,
				calibrationOffsetStops: light.calibrationOffsetStops ?? 0
			});
			const hss = light.highSpeedSync && fasterThanSync ? highSpeedSyncFactor(cam.shutter, sync) : 1;
			return (dM, beam) => beam * hss * sized(dM) * flashExposure(gn, dM, wa);
		}
		const luxAt1m = light.luxAt1m * 2 ** -(light.lossStops ?? 0);
		return (dM, beam) => (beam * sized(dM) * (luxAt1m / (dM * dM)) * cam.iso * cam.shutter) / (CONTINUOUS_CALIBRATION_C * wa * wa);
	};
	/** Lambert's cosine law at a surface facing `normal`, lit from `from`. */
	const surfaceCosine = (from: Vec3, point: Vec3, normal: Vec3 | undefined) => (normal ? facingCosine(normal, subtract3(from, point)) : 1);
	const emitterKelvin = (l: Emitter) => (l.kelvin === undefined ? undefined : l.gelMired ? gelledKelvin(l.kelvin, l.gelMired) : l.kelvin);

	const lights = scene.lights.map((light): FieldLight => {
		const pos = light.position as Vec3;
		if (light.kind !== 'reflector') {
			const beamToward = beamOf(light);
			const emitterX = emitterXOf(light);
			return {
				light,
				position: pos,
				group: light.kind === 'flash' ? 'flash' : 'ambient',
				kelvin: emitterKelvin(light),
				xAt: (point, normal) => {
					const toPointM = Math.max(MIN_EMITTER_DISTANCE_M, distanceM(pos, point));
					return emitterX(toPointM, beamToward(point)) * surfaceCosine(pos, point, normal) * cameraFactor;
				}
			};
		}
		const radiusSquaredM2 = light.areaM2 / Math.PI; // r² of the disc of the card's area
		const n = light.normal as Vec3 | undefined;
		const rho = light.reflectance;
		/** cos θ_out: the card's normal against the direction to the point. */
		const cosOutTo = (point: Vec3) => (n ? facingCosine(n, subtract3(point, pos)) : 1);
		if (light.source === 'ambient') {
			const xAt = (point: Vec3, normal?: Vec3) => {
				const toPointM = distanceM(pos, point);
				const cosOut = cosOutTo(point);
				const x =
					light.surface === 'diffuse' ? rho * ambientX * cosOut * (radiusSquaredM2 / (radiusSquaredM2 + toPointM * toPointM)) : cosOut > 0 ? rho * ambientX : 0;
				return x * surfaceCosine(pos, point, normal) * cameraFactor;
			};
			return { light, position: pos, group: 'ambient', kelvin: scene.ambient?.kelvin, xAt };
		}
		// The schema guarantees the source exists and is an emitter.
		const source = byId.get(light.source) as Emitter;
		const sPos = source.position as Vec3;
		const sourceToCardM = distanceM(sPos, pos);
		const cosIn = n ? facingCosine(n, subtract3(sPos, pos)) : 1;
		const sourceBlocked = crossingFlag(sPos, pos, flags) !== undefined;
		const beam = beamOf(source)(pos);
		const emitterX = emitterXOf(source);
		// A diffuse card's light leaving it toward any point: ρ · X at the card · cos θ_in.
		const diffuseAtCard = rho * emitterX(sourceToCardM, beam) * cosIn;
		const unitNormal = n ? unit3(n) : undefined;
		const radiusM = Math.sqrt(radiusSquaredM2);
		/** A mirror with a known normal lights only where the source's reflection lands within its extent. */
		const specularX = (point: Vec3) => {
			if (!unitNormal) return cosIn > 0 && cosOutTo(point) > 0 ? rho * emitterX(sourceToCardM + distanceM(pos, point), beam) : 0;
			const landing = mirrorLanding(sPos, pos, unitNormal, point);
			return landing && landing.offsetM <= radiusM ? rho * emitterX(landing.pathM, beam) : 0;
		};
		const xAt = (point: Vec3, normal?: Vec3) => {
			if (sourceBlocked) return 0;
			let x: number;
			if (light.surface === 'diffuse') {
				const toPointM = distanceM(pos, point);
				x = diffuseAtCard * cosOutTo(point) * (radiusSquaredM2 / (radiusSquaredM2 + toPointM * toPointM));
			} else {
				x = specularX(point);
			}
			return x * surfaceCosine(pos, point, normal) * cameraFactor;
		};
		return { light, position: pos, group: source.kind === 'flash' ? 'flash' : 'ambient', kelvin: emitterKelvin(source), sourceBlocked, xAt };
	});
	return { workingAperture: wa, ambientX: ambientX * cameraFactor, lights, flags };
}

/** Total X at a point (ambient included, flags applied), as a surface placed there facing `normal` would get. */
export function totalXAt(field: LightField, point: Vec3, normal?: Vec3): number {
	let total = field.ambientX;
	for (const l of field.lights) total += lightXAt(field, l, point, normal);
	return total;
}

/** One light's X at a point: 0 where a flag stands between them (its part of `totalXAt`). */
export function lightXAt(field: LightField, l: FieldLight, point: Vec3, normal?: Vec3): number {
	const x = l.xAt(point, normal);
	return x > 0 && !crossingFlag(l.position, point, field.flags) ? x : 0;
}
