/** Scenes shared by the engine's tests and the editor's falloff map tests. */
import { exposureSceneSchema, type ExposureScene } from './schema';

/**
 * The moss sample on the sill, every kind of light at once: a fill flash in a dome, an aimed lamp, a
 * white card and a silver one on daylight, a bare flash, a flag.
 */
export const mossOnTheSill: ExposureScene = exposureSceneSchema.parse({
	camera: { iso: 400, aperture: 11, shutter: 1 / 250, magnification: 1, pupilMagnification: 0.8, lossStops: 0.3 },
	subject: { position: [0, 0, 0.02], normal: [0, -0.3, 1] },
	ambient: { ev100: 10, kelvin: 6500 },
	lights: [
		{ id: 'fill', kind: 'flash', position: [-0.3, -0.2, 0.25], guideNumber: 28, power: 1 / 16, lossStops: 1.5, aim: [0, 0, 0.02], beamAngleDeg: 120 },
		{ id: 'lamp', kind: 'continuous', position: [0.2, -0.4, 0.3], luxAt1m: 4000, aim: [0.05, 0, 0], beamAngleDeg: 40, kelvin: 3200 },
		{ id: 'white', kind: 'reflector', position: [0.25, 0.05, 0.05], areaM2: 0.04, reflectance: 0.85, surface: 'diffuse', source: 'fill', normal: [-1, -0.2, 0.1] },
		{ id: 'silver', kind: 'reflector', position: [-0.1, 0.3, 0.1], areaM2: 0.02, reflectance: 0.9, surface: 'specular', source: 'ambient' },
		{ id: 'hot', kind: 'flash', position: [0.4, 0.4, 0.1], guideNumber: 20, power: 1 / 4 }
	],
	flags: [{ id: 'cutter', from: [0.3, 0.2], to: [0.3, 0.5] }]
});
