/**
 * The editor's elements: one zod schema per kind, used to read a saved plan and to check every
 * property a command sets. Plan coordinates: x to the right, y down the screen (toward the camera in
 * a default layout), heights above the table top; all in metres. Rotations are in degrees, clockwise
 * on screen from +x, and give the direction an element faces (a light's beam, a card's reflecting
 * side, a camera's lens). Panels (reflectors, diffusers, flags) extend across their facing direction.
 */
import { z } from 'zod';
import { LOWEST_POWER } from '$lib/light/flash';
import {
	calibrationOffsetStopsField,
	ev100Field,
	exposureSceneSchema,
	focalLengthMmField,
	pupilMagnificationField,
	gelMiredField,
	guideNumberField,
	kelvinField,
	lossStopsField,
	powerField,
	range,
	sceneCameraSchema
} from '$lib/light/schema';
import type { ElementKind } from './kinds';

const coordinateM = range(-1000, 1000, 'm');
const heightM = range(-100, 100, 'm');
/** A size on the plan: 1 mm to 100 m. */
const sizeM = range(0.001, 100, 'm');
/** The document's plan takes −360° to 360°; commands keep rotations in (−180°, 180°]. */
const rotationDeg = range(-360, 360, '°');
const tiltDeg = range(-90, 90, '°');

export { ELEMENT_KINDS, type ElementKind } from './kinds';

const base = {
	id: z.string({ error: 'must be a string' }).min(1, 'must not be empty').max(100, 'must be at most 100 characters'),
	label: z.string({ error: 'must be a string' }).max(200, 'must be at most 200 characters'),
	xM: coordinateM,
	yM: coordinateM,
	heightM,
	rotationDeg,
	locked: z.boolean({ error: 'must be true or false' }),
	/** Drawing order: higher draws on top. */
	zIndex: z.number({ error: 'must be a number' }).finite('must be finite')
};

export const EMITTER_SHAPES = ['rectangle', 'disc'] as const;

export const modifierSchema = z.object({
	name: z.string({ error: 'must be a string' }).min(1, 'must not be empty').max(80, 'must be at most 80 characters'),
	/** Full beam angle at half intensity; null: the modifier spreads light evenly (no beam). */
	beamAngleDeg: range(1, 180, '°').nullable(),
	lossStops: lossStopsField,
	/** Width of the front (a softbox's face, a snoot's opening), for the drawing. */
	sizeM: sizeM,
	/**
	 * The shape of a front that glows evenly (a softbox's face, a dome): close to the subject the light
	 * is then an extended source of that size (the scene's `emitterWidthM` × `emitterHeightM`, or
	 * `emitterDiameterM`); absent, a point (a bare head, a snoot, a grid).
	 */
	emitterShape: z.enum(EMITTER_SHAPES, { error: 'must be "rectangle" or "disc"' }).optional(),
	/** A rectangular front's height (absent: as tall as it is wide). */
	heightM: range(0.001, 20, 'm').optional(),
	/** The gear-shelf item it came from; the server copies that item into the revision's gear. */
	gearId: z.uuid({ error: 'must be the id of an item on the gear shelf' }).optional()
});
export type Modifier = z.infer<typeof modifierSchema>;

const vec3 = z.tuple([coordinateM, coordinateM, coordinateM]);
/** The gear-shelf item an element came from; the server copies that item into the revision's gear. */
const gearId = z.uuid({ error: 'must be the id of an item on the gear shelf' }).optional();
const gearName = z.string({ error: 'must be a string' }).min(1, 'must not be empty').max(200, 'must be at most 200 characters');

/** A lens taken from the gear shelf: its name and id (its figures go to the camera element and settings). */
export const lensSchema = z.object({ name: gearName, gearId, pupilMagnification: pupilMagnificationField.optional() });
export type Lens = z.infer<typeof lensSchema>;

export const SUBJECT_FACINGS = ['camera', 'up'] as const;

export const subjectElementSchema = z.object({
	...base,
	kind: z.literal('subject'),
	widthM: sizeM,
	/** Front to back, along the direction the subject faces. */
	depthM: sizeM,
	/** A person or an animal (for the short-range flash caution). */
	living: z.boolean({ error: 'must be true or false' }),
	/**
	 * Which way its face looks when no `normal` is set: toward the camera (the scene's default when the
	 * plan has a camera) or up (a face-up flat specimen, a section). Lambert's cosine law at the subject
	 * follows it (`subjectFacing` in `$lib/light/light-field`).
	 */
	facing: z.enum(SUBJECT_FACINGS, { error: 'must be "camera" or "up"' }),
	/** The face's direction when set (a direction chosen in the inspector, or a scene's normal); it wins over `facing`. */
	normal: vec3.optional()
});

export const cameraElementSchema = z.object({
	...base,
	kind: z.literal('camera'),
	focalLengthMm: focalLengthMmField,
	sensorWidthMm: range(1, 200, 'mm'),
	sensorHeightMm: range(1, 200, 'mm'),
	/** The camera body from the gear shelf. */
	gearId,
	/** The lens from the gear shelf (null: typed by hand). */
	lens: lensSchema.nullable()
});

const emitter = {
	modifier: modifierSchema.nullable(),
	/** Other losses in stops: gels, filters, anything not the modifier or a diffuser on the plan. */
	otherLossStops: lossStopsField,
	/** null: not stated (drawn at the kind's usual colour, left out of the white balance). */
	kelvin: kelvinField.nullable(),
	gelMired: gelMiredField,
	/** Up (+) or down (−) from level, for the beam's axis. */
	tiltDeg
};

export const flashElementSchema = z.object({
	...base,
	...emitter,
	kind: z.literal('flash'),
	guideNumber: guideNumberField,
	/** The flash's calibration in stops (+ = brighter than its guide number), from the gear shelf; the engine applies it. */
	calibrationOffsetStops: calibrationOffsetStopsField,
	power: powerField,
	/** The lowest step of this flash's power ladder (full power down in thirds); 1/256 unless the shelf says. */
	lowestPower: z.number({ error: 'must be a number' }).min(LOWEST_POWER, 'must be at least 1/256').max(1, 'must be at most 1 (full power)'),
	/** The zoom head's setting, when it has one (the beam angle is the modifier's). */
	zoomMm: range(1, 1000, 'mm').nullable(),
	/** The flash from the gear shelf: its guide number, calibration and ladder came from there. */
	gearId,
	highSpeedSync: z.boolean({ error: 'must be true or false' }),
	mainsPowered: z.boolean({ error: 'must be true or false' })
});

export const continuousElementSchema = z.object({
	...base,
	...emitter,
	kind: z.literal('continuous'),
	luxAt1m: range(0.000001, 10_000_000, 'lux'),
	runsHot: z.boolean({ error: 'must be true or false' })
});

const panel = {
	/** Across the facing direction, on the plan. */
	widthM: sizeM,
	/** Upright extent of the panel. */
	panelHeightM: sizeM,
	tiltDeg
};

/** A reflector's face: each is a surface and a reflectance (REFLECTOR_FINISHES in defaults.ts). */
export const REFLECTOR_FINISH_NAMES = ['white', 'silver', 'gold', 'black'] as const;
export type ReflectorFinish = (typeof REFLECTOR_FINISH_NAMES)[number];

export const reflectorElementSchema = z.object({
	...base,
	...panel,
	kind: z.literal('reflector'),
	surface: z.enum(['diffuse', 'specular'], { error: 'must be "diffuse" or "specular"' }),
	reflectance: z.number({ error: 'must be a number' }).gt(0, 'must be greater than 0').max(1, 'must be at most 1'),
	/** The id of the light it bounces, or "ambient". */
	source: z.string({ error: 'must be a string' }).min(1, 'must name a light or "ambient"').max(100),
	/**
	 * false: the card's facing is not set and it is taken to face both its source and the subject
	 * (the engine's ideal card, no normal sent); true: its rotation and tilt give its normal.
	 */
	facingSet: z.boolean({ error: 'must be true or false' })
});

export const diffuserElementSchema = z.object({
	...base,
	...panel,
	kind: z.literal('diffuser'),
	/** Light lost by a light whose path to the subject passes through it. */
	lossStops: lossStopsField
});

export const flagElementSchema = z.object({ ...base, ...panel, kind: z.literal('flag') });

export const AMBIENT_SOURCES = ['window', 'sky'] as const;

/**
 * The ambient light (one a plan: the engine takes one ambient): a window or the open sky, placed where
 * the light comes in and turned the way it travels; its EV at ISO 100 typed or taken from a sky preset
 * (`skyPresetOf` tells which preset an EV is).
 */
export const ambientElementSchema = z.object({
	...base,
	kind: z.literal('ambient'),
	source: z.enum(AMBIENT_SOURCES, { error: 'must be "window" or "sky"' }),
	ev100: ev100Field,
	kelvin: kelvinField.nullable(),
	/** Width of the window (or of the patch of sky drawn), across the direction the light travels. */
	widthM: sizeM
});

export const backgroundElementSchema = z.object({
	...base,
	kind: z.literal('background'),
	widthM: sizeM,
	depthM: sizeM,
	colour: z.string({ error: 'must be a colour such as "#1a1a1a"' }).regex(/^#[0-9a-fA-F]{6}$/, 'must be a colour such as "#1a1a1a"')
});

export const editorElementSchema = z.discriminatedUnion('kind', [
	subjectElementSchema,
	cameraElementSchema,
	flashElementSchema,
	continuousElementSchema,
	reflectorElementSchema,
	diffuserElementSchema,
	flagElementSchema,
	ambientElementSchema,
	backgroundElementSchema
]);

export type SubjectElement = z.infer<typeof subjectElementSchema>;
export type CameraElement = z.infer<typeof cameraElementSchema>;
export type FlashElement = z.infer<typeof flashElementSchema>;
export type ContinuousElement = z.infer<typeof continuousElementSchema>;
export type ReflectorElement = z.infer<typeof reflectorElementSchema>;
export type DiffuserElement = z.infer<typeof diffuserElementSchema>;
export type FlagElement = z.infer<typeof flagElementSchema>;
export type AmbientElement = z.infer<typeof ambientElementSchema>;
export type BackgroundElement = z.infer<typeof backgroundElementSchema>;
export type EditorElement = z.infer<typeof editorElementSchema>;
export type EmitterElement = FlashElement | ContinuousElement;
export type PanelElement = ReflectorElement | DiffuserElement | FlagElement;
export type ElementOfKind<K extends ElementKind> = Extract<EditorElement, { kind: K }>;

/** The camera settings: exactly `scene.camera` of the exposure scene (the engine's own schema). */
export const cameraSettingsSchema = sceneCameraSchema;
export type CameraSettings = z.infer<typeof sceneCameraSchema>;

/** The scene's ambient: what the ambient element gives the engine. */
export const ambientSettingsSchema = exposureSceneSchema.shape.ambient.unwrap();
export type AmbientSettings = z.infer<typeof ambientSettingsSchema>;

export function elementSchemaFor(kind: ElementKind) {
	return editorElementSchema.options.find((o) => o.shape.kind.value === kind)!;
}
