/**
 * Shots: what a shot records and the inputs of the shots API, shared by the server, the API's
 * document and the Shots section of the setup page. Units live in the names.
 */
import { z } from 'zod';
import { apertureField, isoField, shutterField } from '$lib/light/schema';

/** What a file's EXIF recorded, read with exifr; null means "not recorded" (CIPA DC-008 tags named beside each). */
export interface ShotExif {
	fNumber: number | null; // FNumber 0x829D, RATIONAL
	exposureTimeS: number | null; // ExposureTime 0x829A, RATIONAL
	iso: number | null; // PhotographicSensitivity 0x8827, SHORT
	focalLengthMm: number | null; // FocalLength 0x920A, RATIONAL
	flashFired: boolean | null; // Flash 0x9209, bit 0
	flashMode: string | null; // Flash 0x9209, bits 3–4
	takenAt: string | null; // DateTimeOriginal 0x9003, ASCII
	cameraModel: string | null; // Model 0x0110
	lensModel: string | null; // LensModel 0xA434
	/** Values the file held that cannot be right (f/0, ISO 0, a negative time): dropped, and said why. */
	rejected: { field: string; value: string; reason: string }[];
}

export const EXIF_FIELDS = ['fNumber', 'exposureTimeS', 'iso', 'focalLengthMm'] as const;
export type TypedField = (typeof EXIF_FIELDS)[number];

/** The settings in the words the pages show. */
export const SETTING_WORDS: Record<TypedField, string> = { fNumber: 'f-number', exposureTimeS: 'shutter', iso: 'ISO', focalLengthMm: 'focal length' };

/** Values typed by hand (where the EXIF said nothing, or was wrong). */
export type ShotTyped = Partial<Record<TypedField, number>>;

export interface MeasureRegion {
	/** Fractions of the upright preview's width and height, 0–1, from the top-left corner. */
	x: number;
	y: number;
	width: number;
	height: number;
}

export interface MeterReading {
	/** An incident or spot reading: the f-number the meter gives for the shot's shutter and ISO. */
	aperture: number;
}

/** Where a calibration came from: a flash-meter reading (the f-number read at distanceM, at iso and
 * power, through lossStops), a test shot (its actual − predicted and the flash's share of the plan), or
 * an offset typed on the gear shelf. */
export type CalibrationReading =
	| { aperture: number; distanceM: number; iso: number; power: number; lossStops: number }
	| { differenceStops: number; flashShare: number }
	| { typedOffsetStops: number };

const fraction = z.number({ error: 'must be a number' }).min(0, 'must be at least 0').max(1, 'must be at most 1');

export const measureRegionSchema = z
	.object({ x: fraction, y: fraction, width: fraction.gt(0, 'must be greater than 0'), height: fraction.gt(0, 'must be greater than 0') })
	.superRefine((r, ctx) => {
		if (r.x + r.width > 1 + 1e-9) ctx.addIssue({ code: 'custom', path: ['width'], message: 'x + width must be at most 1' });
		if (r.y + r.height > 1 + 1e-9) ctx.addIssue({ code: 'custom', path: ['height'], message: 'y + height must be at most 1' });
	});

/** `POST …/shots/:shotId/measure`: a region of the original, or a meter reading. */
export const shotMeasureSchema = z.union(
	[
		z.object({ method: z.literal('region'), region: measureRegionSchema }),
		z.object({ method: z.literal('meter'), meter: z.object({ aperture: apertureField }) })
	],
	{ error: 'method must be "region" (with region) or "meter" (with meter.aperture)' }
);
export type ShotMeasureInput = z.output<typeof shotMeasureSchema>;

const typedSchema = z
	.object({
		fNumber: apertureField.nullable().optional(),
		exposureTimeS: shutterField.nullable().optional(),
		iso: isoField.nullable().optional(),
		focalLengthMm: z.number({ error: 'must be a number' }).gt(0, 'must be greater than 0').max(5000, 'must be at most 5000 mm').nullable().optional()
	})
	.strict();

/** `PATCH …/shots/:shotId`: typed values (null clears one), the revision it was made from, its session. */
export const shotUpdateSchema = z
	.object({
		typed: typedSchema.optional(),
		revisionNumber: z.int({ error: 'must be a whole number' }).min(1, 'must be at least 1').optional(),
		sessionId: z.uuid({ error: 'must be a session id' }).nullable().optional()
	})
	.refine((u) => Object.values(u).some((v) => v !== undefined), { message: 'give at least one of typed, revisionNumber, sessionId' });
export type ShotUpdateInput = z.output<typeof shotUpdateSchema>;

const noteField = z.string({ error: 'must be text' }).max(2000, 'must be at most 2000 characters');
const dayField = z.iso.date({ error: 'must be a date (YYYY-MM-DD)' });

export const sessionCreateSchema = z.object({ shotOn: dayField, note: noteField.default('') });
export const sessionUpdateSchema = z.object({
	shotOn: dayField.optional(),
	note: noteField.optional(),
	/** The checklist items ticked now (the whole set). */
	ticks: z.array(z.string().max(200)).max(50).optional()
});

export const DEFAULT_CHECKLIST = [
	'Lens on manual focus',
	'Focus checked in magnified live view',
	'Tripod legs and head locked',
	'Stabilisation off on a tripod',
	'Shutter delay or remote release set',
	'Flash test-fired and ready',
	'Working aperture set'
] as const;

export const checklistSchema = z.object({
	items: z
		.array(z.string({ error: 'must be text' }).trim().min(1, 'must not be empty').max(200, 'must be at most 200 characters'))
		.min(1, 'keep at least one item')
		.max(30, 'at most 30 items')
});

/** `POST …/calibrate`: the flash (a gear-shelf id) and where the truth came from. */
export const calibrationSchema = z.union(
	[
		z.object({ method: z.literal('shot'), gearId: z.uuid({ error: 'must be a gear id' }), shotId: z.uuid({ error: 'must be a shot id' }) }),
		z.object({
			method: z.literal('meter'),
			gearId: z.uuid({ error: 'must be a gear id' }),
			aperture: apertureField,
			distanceM: z.number({ error: 'must be a number' }).gt(0, 'must be greater than 0').max(100, 'must be at most 100 m'),
			iso: isoField,
			power: z.number({ error: 'must be a number' }).gt(0, 'must be greater than 0').max(1, 'must be at most 1 (full power)'),
			lossStops: z.number({ error: 'must be a number' }).min(0, 'must be at least 0').max(10, 'must be at most 10').default(0)
		})
	],
	{ error: 'method must be "shot" (with gearId, shotId) or "meter" (with gearId, aperture, distanceM, iso, power)' }
);
export type CalibrationInput = z.output<typeof calibrationSchema>;

export const shotListQuerySchema = z.object({
	trashed: z.enum(['0', '1', 'true', 'false'], { error: 'must be 1 or 0' }).optional()
});

/** The form fields sent beside the files of an upload. */
export const shotUploadFieldsSchema = z.object({
	sessionId: z.uuid({ error: 'must be a session id' }).optional(),
	revisionNumber: z.coerce.number({ error: 'must be a whole number' }).int('must be a whole number').min(1, 'must be at least 1').optional()
});
