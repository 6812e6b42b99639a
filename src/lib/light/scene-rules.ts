/**
 * The exposure scene's rules that span fields, apart from the zod schema that checks each field
 * (`exposureSceneSchema` in schema.ts applies them after the fields): the editor checks the scene it
 * builds from its own checked elements with these alone, so its first load needs no zod.
 */
import { distanceM } from './geometry';
import type { ExposureScene, SceneLight } from './schema';

/** A rule of the scene that spans fields (ids, sources, distances). */
export interface SceneRuleIssue {
	path: (string | number)[];
	message: string;
}

/**
 * The scene's rules that span fields, on a scene whose fields each passed: ids unique and not
 * "ambient", every reflector's source an emitter (or the ambient, when there is one), nothing at the
 * subject or at its own source, flags at least 1 mm long.
 */
export function sceneRuleIssues(scene: ExposureScene): SceneRuleIssue[] {
	const issues: SceneRuleIssue[] = [];
	const { camera } = scene;
	if (camera.minAperture !== undefined && camera.maxAperture !== undefined && camera.minAperture > camera.maxAperture) {
		issues.push({ path: ['camera', 'maxAperture'], message: 'must not be below minAperture' });
	}
	const byId = new Map<string, SceneLight>();
	scene.lights.forEach((light, i) => {
		if (light.id === 'ambient') {
			issues.push({ path: ['lights', i, 'id'], message: '"ambient" is reserved for the ambient light' });
		} else if (byId.has(light.id)) {
			issues.push({ path: ['lights', i, 'id'], message: `duplicate id "${light.id}"` });
		}
		byId.set(light.id, light);
	});
	if (scene.subject.facing === 'camera' && !camera.position && !scene.subject.normal) {
		issues.push({ path: ['subject', 'facing'], message: 'is "camera" but the camera has no position' });
	}
	scene.lights.forEach((light, i) => {
		if (light.kind === 'reflector') return;
		if ((light.emitterWidthM === undefined) !== (light.emitterHeightM === undefined)) {
			issues.push({ path: ['lights', i, light.emitterWidthM === undefined ? 'emitterWidthM' : 'emitterHeightM'], message: 'emitterWidthM and emitterHeightM go together' });
		} else if (light.emitterWidthM !== undefined && light.emitterDiameterM !== undefined) {
			issues.push({ path: ['lights', i, 'emitterDiameterM'], message: 'give a rectangle (emitterWidthM, emitterHeightM) or a disc (emitterDiameterM), not both' });
		}
	});
	scene.lights.forEach((light, i) => {
		const d = distanceM(light.position, scene.subject.position);
		if (light.kind !== 'reflector' && d < 0.001) {
			issues.push({ path: ['lights', i, 'position'], message: 'is at the subject (closer than 1 mm)' });
		}
		if (light.kind !== 'reflector') return;
		if (light.source === 'ambient') {
			if (!scene.ambient) issues.push({ path: ['lights', i, 'source'], message: 'is "ambient" but the scene has no ambient' });
			return;
		}
		const source = byId.get(light.source);
		if (!source) {
			issues.push({ path: ['lights', i, 'source'], message: `names no light: "${light.source}"` });
		} else if (source.kind === 'reflector') {
			issues.push({ path: ['lights', i, 'source'], message: 'must be a flash, a continuous light or "ambient", not another reflector' });
		} else {
			const d1 = distanceM(light.position, source.position);
			if (d1 < 0.001) issues.push({ path: ['lights', i, 'position'], message: `is at its source "${source.id}" (closer than 1 mm)` });
		}
	});
	scene.flags?.forEach((flag, i) => {
		if (Math.hypot(flag.to[0] - flag.from[0], flag.to[1] - flag.from[1]) < 0.001) {
			issues.push({ path: ['flags', i, 'to'], message: 'a flag must be at least 1 mm long' });
		}
	});
	return issues;
}
