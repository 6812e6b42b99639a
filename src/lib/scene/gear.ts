/**
 * What the gear shelf knows about each kind of equipment: one zod schema per kind, shared by the gear
 * forms, the gear API and the copies of gear kept inside setup documents. Units are in the names.
 */
import { z } from 'zod';
import {
	apertureField,
	cocMmField,
	focalLengthMmField,
	guideNumberField,
	kelvinField,
	lossStopsField,
	pupilMagnificationField
} from '$lib/light/schema';

export const GEAR_KINDS = ['flash', 'modifier', 'reflector', 'lens', 'camera'] as const;
export type GearKind = (typeof GEAR_KINDS)[number];
export const gearKindSchema = z.enum(GEAR_KINDS, { error: `must be one of ${GEAR_KINDS.join(', ')}` });

const num = (min: number, max: number, unit = '') =>
	z
		.number({ error: 'must be a number' })
		.min(min, `must be at least ${min}${unit ? ' ' + unit : ''}`)
		.max(max, `must be at most ${max}${unit ? ' ' + unit : ''}`);
const positive = (max: number, unit = '') =>
	z
		.number({ error: 'must be a number' })
		.gt(0, 'must be greater than 0')
		.max(max, `must be at most ${max}${unit ? ' ' + unit : ''}`);

const syncSpeedS = positive(10, 's');

export const flashSpecSchema = z.object({
	/** Guide number in metres at ISO 100 and full power, as the head is set (/api/v1/openapi.json). */
	guideNumberM: guideNumberField,
	/** The lowest power the flash offers, as a fraction of full power (1/128 = 0.0078125). */
	lowestPower: z
		.number({ error: 'must be a number' })
		.gt(0, 'must be greater than 0')
		.max(1, 'must be at most 1 (full power)'),
	syncSpeedS,
	/**
	 * The flash's calibration in force, in stops (+ = it gives more light than its guide number says):
	 * typed here, or recorded from a test shot or a flash-meter reading (`flash_calibrations` keeps the
	 * history, `src/lib/server/calibrations.ts`). Plans carry it as the scene flash's
	 * `calibrationOffsetStops`, which the engine applies; the guide number stays the rated one.
	 */
	calibrationOffsetStops: num(-5, 5, 'stops').default(0),
	/** Zoom head position the guide number was measured at, when it has one. */
	zoomMm: num(1, 1000, 'mm').optional(),
	/**
	 * Guide numbers at each zoom head position (metres, ISO 100, full power), when the flash has a zoom
	 * head: the plan chooses one. Specs stored before this field keep `guideNumberM` alone.
	 */
	guideNumbersByZoom: z
		.array(z.object({ zoomMm: num(1, 1000, 'mm'), guideNumberM: guideNumberField }), { error: 'must be a list of { zoomMm, guideNumberM }' })
		.max(20, 'at most 20 zoom positions')
		.optional(),
	kelvin: kelvinField.optional(),
	/** Runs from the mains (a studio strobe): shown with the usual caution. */
	mainsPowered: z.boolean({ error: 'must be true or false' }).default(false)
});

export type FlashSpec = z.output<typeof flashSpecSchema>;

/**
 * A shelf flash's guide number at a zoom position: the one listed for it; for a position between two
 * listed ones, the wider one's (the lower guide number: never promise light the head may not give);
 * without a list, or wider than any listed, `guideNumberM`.
 */
export function guideNumberAtZoom(spec: Pick<FlashSpec, 'guideNumberM' | 'guideNumbersByZoom'>, zoomMm?: number): number {
	if (zoomMm === undefined || !spec.guideNumbersByZoom?.length) return spec.guideNumberM;
	const atOrWider = spec.guideNumbersByZoom.filter((z) => z.zoomMm <= zoomMm).sort((a, b) => b.zoomMm - a.zoomMm);
	return atOrWider[0]?.guideNumberM ?? spec.guideNumberM;
}

/**
 * What a shelf flash puts into the scene's flash light (`flashLightSchema`): its guide number at the
 * plan's zoom position, its calibration (an offset the engine applies, never multiplied into the guide
 * number) and its lowest power step. The editor copies these onto the light when a shelf flash is chosen.
 */
export function sceneFlashFromShelf(spec: FlashSpec, zoomMm?: number) {
	return {
		guideNumber: guideNumberAtZoom(spec, zoomMm),
		calibrationOffsetStops: spec.calibrationOffsetStops,
		lowestPower: spec.lowestPower,
		...(zoomMm !== undefined ? { zoomMm } : {})
	};
}

export const MODIFIER_SHAPES = ['softbox', 'umbrella', 'dome', 'diffusion panel', 'snoot', 'grid', 'other'] as const;

export const modifierSpecSchema = z.object({
	shape: z.enum(MODIFIER_SHAPES, { error: `must be one of ${MODIFIER_SHAPES.join(', ')}` }).default('other'),
	/** Light lost through the modifier, in stops. */
	lossStops: lossStopsField,
	/** Full beam angle at half intensity, degrees. */
	beamAngleDeg: num(1, 180, '°'),
	widthM: positive(20, 'm').optional(),
	heightM: positive(20, 'm').optional()
});

export const reflectorSpecSchema = z.object({
	widthM: positive(20, 'm'),
	heightM: positive(20, 'm'),
	/** Fraction of the light returned, 0–1. */
	reflectance: z.number({ error: 'must be a number' }).gt(0, 'must be greater than 0').max(1, 'must be at most 1'),
	surface: z.enum(['diffuse', 'specular'], { error: 'must be "diffuse" or "specular"' })
});

export const lensSpecSchema = z
	.object({
		focalLengthMm: focalLengthMmField,
		maxMagnification: positive(100),
		pupilMagnification: pupilMagnificationField.default(1),
		/** The aperture range as marked: the widest opening (smallest f-number) and the narrowest. */
		widestAperture: apertureField,
		narrowestAperture: apertureField
	})
	.superRefine((lens, ctx) => {
		if (lens.widestAperture > lens.narrowestAperture) {
			ctx.addIssue({
				code: 'custom',
				path: ['narrowestAperture'],
				message: 'must be a larger f-number than widestAperture'
			});
		}
	});

export const cameraSpecSchema = z.object({
	sensorWidthMm: positive(200, 'mm'),
	sensorHeightMm: positive(200, 'mm'),
	/** Circle of confusion used for depth of field, mm. */
	cocMm: cocMmField,
	/** Pixel pitch, µm: for a pixel-level circle of confusion when stacking. */
	pixelPitchUm: positive(100, 'µm').optional(),
	syncSpeedS
});

export const gearSpecSchemas = {
	flash: flashSpecSchema,
	modifier: modifierSpecSchema,
	reflector: reflectorSpecSchema,
	lens: lensSpecSchema,
	camera: cameraSpecSchema
} as const satisfies Record<GearKind, z.ZodType>;

export type GearSpec<K extends GearKind = GearKind> = z.output<(typeof gearSpecSchemas)[K]>;

const nameField = z
	.string({ error: 'must be text' })
	.trim()
	.min(1, 'must not be empty')
	.max(200, 'must be at most 200 characters');
const gearNotesField = z.string({ error: 'must be text' }).max(2000, 'must be at most 2000 characters');

/** A new item on the gear shelf: `{ studioId?, kind, name, spec, notes? }`. */
export const gearCreateSchema = z
	.object({
		studioId: z.uuid({ error: 'must be a studio id' }).optional(),
		kind: gearKindSchema,
		name: nameField,
		spec: z.record(z.string(), z.unknown(), { error: 'must be an object' }),
		notes: gearNotesField.default('')
	})
	.transform((input, ctx) => {
		const spec = gearSpecSchemas[input.kind].safeParse(input.spec);
		if (!spec.success) {
			for (const issue of spec.error.issues) {
				ctx.addIssue({ code: 'custom', path: ['spec', ...issue.path.map(String)], message: issue.message });
			}
			return z.NEVER;
		}
		return { ...input, spec: spec.data as Record<string, unknown> };
	});
export type GearCreateInput = z.output<typeof gearCreateSchema>;

/** The query string of `GET /api/v1/gear`. */
export const gearQuerySchema = z.object({
	studio: z.uuid({ error: 'must be a studio id' }).optional(),
	kind: gearKindSchema.optional(),
	retired: z.enum(['0', '1', 'true', 'false'], { error: 'must be 1 or 0' }).optional()
});

/** A change to an item: any of name, spec (whole, checked against the item's kind), notes, retired. */
export const gearUpdateSchema = z
	.object({
		name: nameField.optional(),
		spec: z.record(z.string(), z.unknown(), { error: 'must be an object' }).optional(),
		notes: gearNotesField.optional(),
		retired: z.boolean({ error: 'must be true or false' }).optional()
	})
	.refine((u) => Object.values(u).some((v) => v !== undefined), { message: 'give at least one of name, spec, notes, retired' });
export type GearUpdateInput = z.output<typeof gearUpdateSchema>;

/** Checks a spec against its kind; issues carry paths under `spec`. */
export function parseGearSpec(kind: GearKind, spec: unknown) {
	const r = gearSpecSchemas[kind].safeParse(spec);
	if (r.success) return { ok: true as const, spec: r.data as Record<string, unknown> };
	return {
		ok: false as const,
		issues: r.error.issues.map((i) => ({ path: ['spec', ...i.path.map(String)], message: i.message }))
	};
}
