/**
 * Safety cautions the engine raises for the calculator page and the plan: hot continuous lamps near
 * paper, foam board, fabric or gels; a mirror-like reflector bouncing sunlight or ambient light; flash at
 * very short range to a person or an animal; mains-powered strobes; a top-heavy tripod.
 * Each text is the usual caution and defers to the equipment's manual and local rules: the distances
 * below are our own conservative thresholds, not safety ratings.
 */
import { distanceM, plan, pointSegmentDistanceM, type Vec3 } from './geometry';
import { formatDistance } from './format';
import type { ExposureScene } from './schema';

/** A hot lamp nearer than this to a card, flag or gel raises a caution (ours, conservative). */
export const HOT_LIGHT_CLEARANCE_M = 0.5;
/** A flash nearer than this to a living subject raises a caution (ours, conservative). */
export const LIVING_SUBJECT_FLASH_DISTANCE_M = 0.5;

export type CautionCode =
	| 'hot-light-near-material'
	| 'hot-light-gel'
	| 'specular-reflector-ambient'
	| 'flash-near-living-subject'
	| 'mains-strobe'
	| 'top-heavy-tripod';

export interface Caution {
	code: CautionCode;
	message: string;
	/** The lights, reflectors or flags concerned. */
	elementIds: string[];
}

const DEFER = 'Follow the equipment’s manual, local codes and licensed practice.';

export function hotLightNearMaterialCaution(lightId: string, materialId: string, gapM: number): Caution {
	return {
		code: 'hot-light-near-material',
		message: `Continuous light “${lightId}” is ${formatDistance(gapM, 'metric')} from “${materialId}”: lamps that run hot (tungsten, halogen, some LEDs) can scorch or ignite paper, foam board, fabric and gels. Keep a clear gap, never leave a lit lamp unattended, and switch off before moving cards. ${DEFER}`,
		elementIds: [lightId, materialId]
	};
}

export function hotLightGelCaution(lightId: string): Caution {
	return {
		code: 'hot-light-gel',
		message: `Continuous light “${lightId}” carries a gel: on a hot lamp a gel can melt, fade or catch fire. Use gel rated for the lamp, mount it in a frame away from the bulb, and let it cool. ${DEFER}`,
		elementIds: [lightId]
	};
}

export function specularAmbientCaution(reflectorId: string): Caution {
	return {
		code: 'specular-reflector-ambient',
		message: `Reflector “${reflectorId}” is mirror-like and bounces the ambient light: reflected sunlight can dazzle and, concentrated, can burn skin or scorch a subject. Never aim it at eyes, yours or anyone’s, and never point a lens or a mirror at the sun. ${DEFER}`,
		elementIds: [reflectorId]
	};
}

export function flashNearLivingSubjectCaution(flashId: string, rangeM: number): Caution {
	return {
		code: 'flash-near-living-subject',
		message: `Flash “${flashId}” is ${formatDistance(rangeM, 'metric')} from a living subject: flash at very short range can startle and may harm the eyes of people and animals. Diffuse it, keep your distance, limit the number of flashes, and follow the flash’s manual and the local rules for photographing animals.`,
		elementIds: [flashId]
	};
}

export function mainsStrobeCaution(flashId: string): Caution {
	return {
		code: 'mains-strobe',
		message: `Flash “${flashId}” runs on mains power: keep cables dry and taped down, never open the head (its capacitors hold a dangerous charge after switch-off), and let a qualified person check damaged leads. ${DEFER}`,
		elementIds: [flashId]
	};
}

export function topHeavyTripodCaution(how: 'extended' | 'reversed'): Caution {
	return {
		code: 'top-heavy-tripod',
		message: `The tripod’s centre column is ${how}: the camera is top-heavy. Put a leg under the lens, weight or brace the tripod and keep cables from snagging it. ${DEFER}`,
		elementIds: []
	};
}

/** Every caution a scene raises, in a stable order. */
export function sceneCautions(scene: ExposureScene): Caution[] {
	const out: Caution[] = [];
	const subject = scene.subject.position as Vec3;
	for (const light of scene.lights) {
		if (light.kind === 'continuous' && light.runsHot !== false) {
			for (const other of scene.lights) {
				if (other.kind !== 'reflector') continue;
				const gap = distanceM(light.position as Vec3, other.position as Vec3);
				if (gap < HOT_LIGHT_CLEARANCE_M) out.push(hotLightNearMaterialCaution(light.id, other.id, gap));
			}
			for (const flag of scene.flags ?? []) {
				const gap = pointSegmentDistanceM(plan(light.position as Vec3), flag.from, flag.to);
				if (gap < HOT_LIGHT_CLEARANCE_M) out.push(hotLightNearMaterialCaution(light.id, flag.id, gap));
			}
			if (light.gelMired !== undefined && light.gelMired !== 0) out.push(hotLightGelCaution(light.id));
		}
		if (light.kind === 'reflector' && light.surface === 'specular' && light.source === 'ambient') {
			out.push(specularAmbientCaution(light.id));
		}
		if (light.kind === 'flash') {
			const range = distanceM(light.position as Vec3, subject);
			if (scene.subject.living && range < LIVING_SUBJECT_FLASH_DISTANCE_M) {
				out.push(flashNearLivingSubjectCaution(light.id, range));
			}
			if (light.mainsPowered) out.push(mainsStrobeCaution(light.id));
		}
	}
	const column = scene.camera.centreColumn;
	if (column === 'extended' || column === 'reversed') out.push(topHeavyTripodCaution(column));
	return out;
}
