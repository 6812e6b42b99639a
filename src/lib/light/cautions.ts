/**
 * Safety cautions the engine raises for the calculator page and the plan: hot continuous lamps near
 * paper, foam board, fabric or gels, or near a live subject (insects above all); a mirror-like reflector
 * bouncing sunlight or ambient light; a close-up lens in sunshine (a burning glass); flash at very short
 * range to a person or an animal; a small flash firing through a gel or a diffuser on its head;
 * mains-powered strobes and their modelling lamps; a top-heavy tripod; a reversed centre column.
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
	| 'top-heavy-tripod'
	| 'reversed-centre-column'
	| 'hot-light-living-subject'
	| 'flash-head-overheating'
	| 'close-up-lens-sun'
	| 'specular-reflector-flash';

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
		message: `Flash “${flashId}” runs on mains power: keep cables dry and taped down, never open the head (its capacitors hold a dangerous charge after switch-off), and let a qualified person check damaged leads. Its modelling lamp runs hot inside the head: keep gels, diffusers and cards off the lamp and switch it off when it is not needed. ${DEFER} Mains wiring is work for a licensed electrician.`,
		elementIds: [flashId]
	};
}

export function topHeavyTripodCaution(): Caution {
	return {
		code: 'top-heavy-tripod',
		message: `The tripod’s centre column is extended: the camera is top-heavy. Put a leg under the lens, weight or brace the tripod and keep cables from snagging it. ${DEFER}`,
		elementIds: []
	};
}

export function reversedCentreColumnCaution(): Caution {
	return {
		code: 'reversed-centre-column',
		message: `The tripod’s centre column is reversed: the camera hangs low between the legs, off the tripod’s centre. Keep its weight over the middle, put a leg under the lens, and mind that the camera or lens can swing into a leg when you turn it. ${DEFER}`,
		elementIds: []
	};
}

export function hotLightLivingSubjectCaution(lightId: string, gapM: number): Caution {
	return {
		code: 'hot-light-living-subject',
		message: `Continuous light “${lightId}” is ${formatDistance(gapM, 'metric')} from a living subject: a hot lamp close up can overheat and kill insects and other small animals within minutes. Use a cool light or flash, keep sessions short and watch the subject. ${DEFER}`,
		elementIds: [lightId]
	};
}

export function flashHeadOverheatingCaution(flashId: string): Caution {
	return {
		code: 'flash-head-overheating',
		message: `Flash “${flashId}” fires through a gel or a diffuser on its head: over a long focus stack or many frames in a row, a small flash can overheat and the gel or diffuser can melt. Let it cool between runs and keep to the thermal limits in the flash’s manual. ${DEFER}`,
		elementIds: [flashId]
	};
}

export function closeUpLensSunCaution(): Caution {
	return {
		code: 'close-up-lens-sun',
		message: `A close-up lens or magnifier is a burning glass: in sunshine it can focus the sun onto the subject, your hand, the camera or dry material and burn them. Keep it capped or shaded when not shooting and never look through it toward the sun. ${DEFER}`,
		elementIds: []
	};
}

export function specularFlashCaution(reflectorId: string): Caution {
	return {
		code: 'specular-reflector-flash',
		message: `Reflector “${reflectorId}” is mirror-like: it returns the flash as a hard, concentrated spot. Keep it from pointing at anyone’s eyes, yours included. ${DEFER}`,
		elementIds: [reflectorId]
	};
}

/** The gel question's caution: a gel on any light, hot lamp or small flash. */
export function gelOnLightCaution(): string {
	return `On a hot lamp a gel can melt, fade or catch fire: use gel rated for the lamp, in a frame away from the bulb. Taped over a small flash’s head it can overheat the flash over many frames in a row: let it cool between runs. ${DEFER}`;
}

/** Ambient brighter than this (EV at ISO 100; 14 is hazy sun by the sunny-16 rule) counts as sunshine. */
export const SUNSHINE_EV100 = 14;

/** Every caution a scene raises, in a stable order. */
export function sceneCautions(scene: ExposureScene): Caution[] {
	const out: Caution[] = [];
	const subject = scene.subject.position as Vec3;
	for (const light of scene.lights) {
		if (light.kind === 'continuous' && light.runsHot !== false) {
			const range = distanceM(light.position as Vec3, subject);
			if (scene.subject.living && range < HOT_LIGHT_CLEARANCE_M) out.push(hotLightLivingSubjectCaution(light.id, range));
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
		if (light.kind === 'reflector' && light.surface === 'specular') {
			out.push(light.source === 'ambient' ? specularAmbientCaution(light.id) : specularFlashCaution(light.id));
		}
		if (light.kind === 'flash') {
			const range = distanceM(light.position as Vec3, subject);
			if (scene.subject.living && range < LIVING_SUBJECT_FLASH_DISTANCE_M) {
				out.push(flashNearLivingSubjectCaution(light.id, range));
			}
			if (light.mainsPowered) out.push(mainsStrobeCaution(light.id));
			else if ((light.lossStops ?? 0) > 0 || (light.gelMired ?? 0) !== 0) out.push(flashHeadOverheatingCaution(light.id));
		}
	}
	if (scene.camera.magnificationBy === 'close-up-lens' && (scene.ambient?.ev100 ?? 0) >= SUNSHINE_EV100) out.push(closeUpLensSunCaution());
	const column = scene.camera.centreColumn;
	if (column === 'extended') out.push(topHeavyTripodCaution());
	if (column === 'reversed') out.push(reversedCentreColumnCaution());
	return out;
}
