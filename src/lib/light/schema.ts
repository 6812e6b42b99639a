/**
 * The zod schemas of every calculation route body and of the exposure scene: one schema per input,
 * shared by the API routes, the calculator page and (as `document.scene`) the setup notebook.
 *
 * Ranges are wide enough for any real photograph and narrow enough that no result can overflow to
 * Infinity; counts are capped (at most 100 lights, 100 flags) so an absurd scene is refused at once.
 * Field names and units are those of API.md and never change; extra fields are ours.
 */
import { z } from 'zod';
import { SKY_PRESET_NAMES, type SkyPreset } from './ambient';
import { GEL_NAMES, type GelName } from './colour';
import { MAGNIFICATION_METHODS } from './optics';
import { sceneRuleIssues } from './scene-rules';

export const MAX_LIGHTS = 100;
export const MAX_FLAGS = 100;
export const MAX_COLOUR_SOURCES = 100;

/** A number from `min` to `max`, its messages naming the unit: the one range helper of every schema. */
export function range(min: number, max: number, unit = '') {
	const u = unit ? ` ${unit}` : '';
	return z
		.number({ error: 'must be a number' })
		.min(min, `must be at least ${min}${u}`)
		.max(max, `must be at most ${max}${u}`);
}

function above(min: number, max: number, unit = '') {
	const u = unit ? ` ${unit}` : '';
	return z
		.number({ error: 'must be a number' })
		.gt(min, `must be greater than ${min}${u}`)
		.max(max, `must be at most ${max}${u}`);
}

// Shared fields (the API's units: metres, mm, nm, seconds, stops, degrees).
export const guideNumberField = above(0, 1000, 'm');
export const distanceField = range(0.001, 1000, 'm');
export const isoField = range(1, 10_000_000);
export const powerField = z
	.number({ error: 'must be a number' })
	.gt(0, 'must be greater than 0 (a fraction of full power)')
	.max(1, 'must be at most 1 (full power)');
export const lossStopsField = range(0, 30, 'stops');
export const magnificationField = range(0, 100);
export const pupilMagnificationField = range(0.05, 20);
export const apertureField = range(0.5, 512);
export const cocMmField = range(0.0005, 5, 'mm');
export const wavelengthNmField = range(200, 2000, 'nm');
export const focalLengthMmField = range(1, 5000, 'mm');
export const shutterField = range(0.000001, 100_000, 's');
export const ev100Field = range(-20, 30, 'EV');
export const illuminanceLuxField = range(0.000001, 10_000_000, 'lux');
export const kelvinField = range(500, 100_000, 'K');
export const gelMiredField = range(-1000, 1000, 'mired');

/** How the magnification is made (optics.ts, `apertureFactor`); absent means extension, the API's rule. */
export const magnificationByField = z.enum(MAGNIFICATION_METHODS, { error: `must be one of ${MAGNIFICATION_METHODS.join(', ')}` });
export const teleconverterFactorField = range(1, 4);
export const calibrationOffsetStopsField = range(-5, 5, 'stops');
/** The lowest power a flash offers (the gear shelf's `lowestPower`): its ladder ends there. */
export const lowestPowerField = powerField;
const sensorSideMmField = above(0, 200, 'mm');
const pixelPitchUmField = above(0, 100, 'µm');
const cocBasisField = z.enum(['sensor', 'pixel'], { error: 'must be "sensor" or "pixel"' });

/** The fields that say how the magnification is made, shared by every question that takes one. */
const lensSetupFields = {
	magnificationBy: magnificationByField.optional(),
	teleconverterFactor: teleconverterFactorField.optional()
};

/** The fields a circle of confusion can come from instead of `cocMm` (optics.ts, `circleOfConfusion`). */
const cocSourceFields = {
	sensorWidthMm: sensorSideMmField.optional(),
	sensorHeightMm: sensorSideMmField.optional(),
	pixelPitchUm: pixelPitchUmField.optional(),
	cocBasis: cocBasisField.optional()
};

const coordinate = range(-10_000, 10_000, 'm');
export const vec3Schema = z.tuple([coordinate, coordinate, coordinate], { error: 'must be [x, y, z] in metres' });
export const vec2Schema = z.tuple([coordinate, coordinate], { error: 'must be [x, y] in metres' });
const idField = z.string({ error: 'must be a string' }).min(1, 'must not be empty').max(100, 'must be at most 100 characters');

// ---------- POST /api/v1/calc/flash ----------
export const flashCalcSchema = z.object({
	guideNumber: guideNumberField,
	distance: distanceField,
	iso: isoField.default(100),
	power: powerField.default(1),
	lossStops: lossStopsField.default(0),
	magnification: magnificationField.default(0),
	pupilMagnification: pupilMagnificationField.default(1),
	...lensSetupFields,
	calibrationOffsetStops: calibrationOffsetStopsField.optional(),
	lowestPower: lowestPowerField.optional(),
	widestAperture: apertureField.optional(),
	narrowestAperture: apertureField.optional(),
	subjectDepthMm: above(0, 10_000, 'mm').optional(),
	aperture: apertureField.optional(),
	living: z.boolean({ error: 'must be true or false' }).optional()
});
export type FlashCalcBody = z.input<typeof flashCalcSchema>;

// ---------- POST /api/v1/calc/optics ----------
export const opticsCalcSchema = z.object({
	aperture: apertureField,
	// Above 0 (/api/v1/openapi.json); from 1:10 000 up, so the close-up depth of field stays finite.
	magnification: range(0.0001, 100),
	pupilMagnification: pupilMagnificationField.default(1),
	...lensSetupFields,
	/** 0.03 mm unless given or worked out from the sensor fields. */
	cocMm: cocMmField.optional(),
	...cocSourceFields,
	wavelengthNm: wavelengthNmField.default(550),
	focalLengthMm: focalLengthMmField.optional(),
	subjectDepthMm: above(0, 100_000, 'mm').optional(),
	overlap: z
		.number({ error: 'must be a number' })
		.min(0, 'must be at least 0')
		.max(0.95, 'must be at most 0.95 (below 1)')
		.default(0.2)
});
export type OpticsCalcBody = z.input<typeof opticsCalcSchema>;

// ---------- POST /api/v1/calc/ambient ----------
const AMBIENT_SOURCES = ['ev100', 'illuminanceLux', 'luminanceCdM2', 'skyPreset', 'meter'] as const;

export const ambientCalcSchema = z
	.object({
		ev100: ev100Field.optional(),
		illuminanceLux: illuminanceLuxField.optional(),
		calibrationC: range(50, 1000).default(250),
		luminanceCdM2: range(0.000001, 10_000_000, 'cd/m²').optional(),
		calibrationK: range(5, 50).default(12.5),
		skyPreset: z.enum(SKY_PRESET_NAMES as [SkyPreset, ...SkyPreset[]], { error: `must be one of ${SKY_PRESET_NAMES.join(', ')}` }).optional(),
		meter: z.object({ aperture: apertureField, shutter: shutterField, iso: isoField.default(100) }).optional(),
		iso: isoField.default(100),
		aperture: apertureField,
		shutter: shutterField.optional(),
		magnification: magnificationField.default(0),
		pupilMagnification: pupilMagnificationField.default(1),
		...lensSetupFields,
		lossStops: lossStopsField.default(0),
		balanceUnderStops: range(-10, 10, 'stops').optional(),
		flashOffsetStops: range(-10, 10, 'stops').optional(),
		syncSpeed: range(0.00001, 10, 's').default(1 / 200)
	})
	.superRefine((body, ctx) => {
		const given = AMBIENT_SOURCES.filter((k) => body[k] !== undefined);
		if (given.length === 0) {
			ctx.addIssue({ code: 'custom', path: ['ev100'], message: 'give ev100 or illuminanceLux (or luminanceCdM2, skyPreset, meter)' });
		} else if (given.length > 1) {
			ctx.addIssue({ code: 'custom', path: [given[1]], message: `give only one ambient reading, not both ${given[0]} and ${given[1]}` });
		}
	});
export type AmbientCalcBody = z.input<typeof ambientCalcSchema>;

// ---------- POST /api/v1/calc/colour ----------
export const colourCalcSchema = z
	.object({
		fromKelvin: kelvinField.optional(),
		toKelvin: kelvinField.optional(),
		kelvin: kelvinField.optional(),
		gelMired: gelMiredField.optional(),
		gel: z.enum(GEL_NAMES as [GelName, ...GelName[]], { error: `must be one of ${GEL_NAMES.join(', ')}` }).optional(),
		sources: z
			.array(z.object({ kelvin: kelvinField, share: range(0, 1e12) }))
			.min(1, 'must name at least one source')
			.max(MAX_COLOUR_SOURCES, `at most ${MAX_COLOUR_SOURCES} sources`)
			.optional()
	})
	.superRefine((body, ctx) => {
		if ((body.fromKelvin === undefined) !== (body.toKelvin === undefined)) {
			const missing = body.fromKelvin === undefined ? 'fromKelvin' : 'toKelvin';
			ctx.addIssue({ code: 'custom', path: [missing], message: 'fromKelvin and toKelvin go together' });
		}
		if (body.gelMired !== undefined && body.gel !== undefined) {
			ctx.addIssue({ code: 'custom', path: ['gel'], message: 'give gelMired or gel, not both' });
		}
		const hasGel = body.gelMired !== undefined || body.gel !== undefined;
		if ((body.kelvin === undefined) !== !hasGel) {
			const missing = body.kelvin === undefined ? 'kelvin' : 'gelMired';
			ctx.addIssue({ code: 'custom', path: [missing], message: 'kelvin and gelMired go together' });
		}
		if (body.kelvin !== undefined && body.gelMired !== undefined && 1e6 / body.kelvin + body.gelMired <= 0) {
			ctx.addIssue({ code: 'custom', path: ['gelMired'], message: `a gel of ${body.gelMired} mired is bluer than any real light from ${body.kelvin} K` });
		}
		if (body.fromKelvin === undefined && body.kelvin === undefined && body.sources === undefined && body.toKelvin === undefined && !hasGel) {
			ctx.addIssue({ code: 'custom', path: ['fromKelvin'], message: 'give fromKelvin and toKelvin, or kelvin and gelMired' });
		}
	});
export type ColourCalcBody = z.input<typeof colourCalcSchema>;

// ---------- POST /api/v1/exposure: the scene ----------
const beamAngleDeg = range(1, 180, '°');
const emitterSideM = above(0, 20, 'm');
/**
 * Extra: the light's face when it has a size (a softbox's front, a dome): a rectangle `emitterWidthM` ×
 * `emitterHeightM` or a disc `emitterDiameterM`. Nearer than five sizes it is an extended source
 * (extended-source.ts); without them it is a point.
 */
const emitterSizeFields = {
	emitterWidthM: emitterSideM.optional(),
	emitterHeightM: emitterSideM.optional(),
	emitterDiameterM: emitterSideM.optional()
};

export const flashLightSchema = z.object({
	id: idField,
	kind: z.literal('flash'),
	position: vec3Schema,
	guideNumber: guideNumberField,
	power: powerField,
	lossStops: lossStopsField.optional(),
	/** Extra, from the gear shelf: measured output against the guide number, stops (+ = brighter). */
	calibrationOffsetStops: calibrationOffsetStopsField.optional(),
	/** Extra, from the gear shelf: the flash's lowest power step (a power below it is warned about). */
	lowestPower: lowestPowerField.optional(),
	/** Extra: the zoom head position the guide number belongs to (the shelf's guide number at that zoom). */
	zoomMm: range(1, 1000, 'mm').optional(),
	/** Extra: the point the head is aimed at (default: the subject). */
	aim: vec3Schema.optional(),
	...emitterSizeFields,
	/** Extra: full beam angle at half intensity; with `aim`, off-axis falloff (see geometry.ts). */
	beamAngleDeg: beamAngleDeg.optional(),
	highSpeedSync: z.boolean().optional(),
	kelvin: kelvinField.optional(),
	gelMired: gelMiredField.optional(),
	mainsPowered: z.boolean().optional()
});

export const continuousLightSchema = z.object({
	id: idField,
	kind: z.literal('continuous'),
	position: vec3Schema,
	luxAt1m: range(0.000001, 10_000_000, 'lux'),
	lossStops: lossStopsField.optional(),
	aim: vec3Schema.optional(),
	...emitterSizeFields,
	beamAngleDeg: beamAngleDeg.optional(),
	kelvin: kelvinField.optional(),
	gelMired: gelMiredField.optional(),
	/** Extra: the lamp runs hot (tungsten, halogen). Assumed true when absent, for the caution. */
	runsHot: z.boolean().optional()
});

export const reflectorSchema = z.object({
	id: idField,
	kind: z.literal('reflector'),
	position: vec3Schema,
	areaM2: range(0.000001, 100, 'm²'),
	reflectance: z.number({ error: 'must be a number' }).gt(0, 'must be greater than 0').max(1, 'must be at most 1'),
	surface: z.enum(['diffuse', 'specular'], { error: 'must be "diffuse" or "specular"' }),
	source: idField,
	normal: vec3Schema.optional()
});

export const sceneLightSchema = z.discriminatedUnion('kind', [flashLightSchema, continuousLightSchema, reflectorSchema], {
	error: 'kind must be "flash", "continuous" or "reflector"'
});

export const flagSchema = z.object({ id: idField, from: vec2Schema, to: vec2Schema });

export const sceneCameraSchema = z.object({
	iso: isoField,
	aperture: apertureField,
	shutter: shutterField,
	magnification: magnificationField,
	pupilMagnification: pupilMagnificationField.optional(),
	...lensSetupFields,
	/** Extra: where the camera is; the subject faces it unless told otherwise (Lambert's cosine law). */
	position: vec3Schema.optional(),
	focalLengthMm: focalLengthMmField.optional(),
	cocMm: cocMmField.optional(),
	...cocSourceFields,
	wavelengthNm: wavelengthNmField.optional(),
	lossStops: lossStopsField.optional(),
	syncSpeed: range(0.00001, 10, 's').optional(),
	minAperture: apertureField.optional(),
	maxAperture: apertureField.optional(),
	/** Extra: a centre column raised high or reversed makes a tripod top-heavy (a caution). */
	centreColumn: z.enum(['down', 'extended', 'reversed']).optional()
});

/** The scene's fields, each checked on its own (the rules across fields follow). */
const exposureSceneShape = z.object({
	camera: sceneCameraSchema,
	subject: z.object({
		position: vec3Schema,
		/** Extra: a person or an animal, for the short-range flash caution. */
		living: z.boolean().optional(),
		/** Extra: the subject's surface normal; when given, Lambert's cosine law applies to each light. */
		normal: vec3Schema.optional(),
		/**
		 * Extra: which way the subject's face looks when no `normal` is given: `camera` (toward
		 * `camera.position`, the default when that is given) or `up` (a face-up flat specimen, a section).
		 */
		facing: z.enum(['camera', 'up'], { error: 'must be "camera" or "up"' }).optional(),
		/** Extra: the subject's depth along the camera axis, mm, for each light's front-to-back falloff. */
		depthMm: above(0, 10_000, 'mm').optional()
	}),
	ambient: z.object({ ev100: ev100Field, kelvin: kelvinField.optional() }).optional(),
	lights: z.array(sceneLightSchema).max(MAX_LIGHTS, `at most ${MAX_LIGHTS} lights`),
	flags: z.array(flagSchema).max(MAX_FLAGS, `at most ${MAX_FLAGS} flags`).optional()
});

export const exposureSceneSchema = exposureSceneShape.superRefine((scene, ctx) => {
	for (const issue of sceneRuleIssues(scene)) ctx.addIssue({ code: 'custom', ...issue });
});

export type ExposureScene = z.infer<typeof exposureSceneSchema>;
export type ExposureSceneInput = z.input<typeof exposureSceneSchema>;
export type SceneLight = ExposureScene['lights'][number];
export type FlashLight = z.infer<typeof flashLightSchema>;
export type ContinuousLight = z.infer<typeof continuousLightSchema>;
export type Reflector = z.infer<typeof reflectorSchema>;
export type Flag = z.infer<typeof flagSchema>;
