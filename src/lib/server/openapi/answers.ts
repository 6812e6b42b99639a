/**
 * What each JSON route answers, as zod schemas: they are written for the OpenAPI document (see
 * routes.ts), and `openapi.http.test.ts` parses the running app's real answers with them, so a field
 * written here is a field the server sends. Objects are open: the contract adds fields freely.
 */
import { z } from 'zod';
import { setupDocumentSchema } from '$lib/scene/document';
import { GEAR_KINDS } from '$lib/scene/gear';
import { setupExportSchema } from '$lib/scene/export';

const num = z.number();
const text = z.string();
const dateTime = z.iso.datetime({ offset: true });
const id = z.uuid();
const revisionNumber = z.int().min(1);

export const errorAnswer = z.object({
	error: z.object({
		message: text,
		issues: z.array(z.object({ path: z.array(text), message: text })).describe('every field at fault, by its path in the input')
	})
});

export const staleSaveAnswer = errorAnswer.extend({
	latestRevision: revisionNumber,
	conflict: z
		.object({
			baseRevision: revisionNumber,
			latestRevision: revisionNumber,
			revisions: z.array(z.object({ number: revisionNumber, authorName: text.nullable(), createdAt: text, message: text.nullable() })),
			changes: z.array(text).describe('what the saves since the base changed, in words'),
			latestNotes: text,
			notesSinceBase: z.array(z.object({ op: z.enum(['same', 'added', 'removed']), line: text })),
			latestTitle: text,
			latestSubject: text,
			latestTags: z.array(text)
		})
		.optional()
		.describe('the saves made since `baseRevision` and what they changed, when that could be told')
});

// ---------- the calculation API ----------

export const flashAnswer = z.object({
	effectiveGuideNumber: num.describe('GN × √(ISO/100) × √power × 2^(−lossStops/2), metres'),
	workingApertureForCorrect: num.describe('effectiveGuideNumber / distance'),
	markedApertureForCorrect: num.describe('workingApertureForCorrect / (1 + m/P); with `magnificationBy`, divided by that method’s factor instead'),
	bellowsFactor: num.describe('(N_w / N)²: (1 + m/P)² by extension, 1 with a close-up lens'),
	workingAperture: num.optional().describe('N × (1 + m/P), N the marked aperture; `magnificationBy` and `teleconverterFactor` change the factor (close-up lens: N; reversed lens: N × (1/P + m); camera shows working: N)'),
	exposureOffsetStops: num.optional().describe('2·log2(workingApertureForCorrect / workingAperture); positive = over'),
	requiredPower: num.optional().describe('the exact fraction of full power for a correct exposure; may exceed 1'),
	withinRange: z.boolean().optional(),
	nearestPowerStep: z
		.object({ fraction: num, label: text, residualStops: num })
		.optional()
		.describe('the ladder step (2^(−k/3), k = 0…24, ending at `lowestPower` when given) nearest to requiredPower in stops, with the error left there (positive = over)'),
	lowestPowerStep: z.object({ fraction: num, label: text }).describe('the last step of this flash’s ladder: 1/256, or `lowestPower` rounded to the ladder'),
	depthFalloffStops: num.optional().describe('with subjectDepthMm: 2·log2((d + D/2) / (d − D/2)), the light the subject’s front gets over its back'),
	markedApertureOutsideLens: z.enum(['wider', 'narrower']).optional().describe('markedApertureForCorrect lies outside widestAperture…narrowestAperture, when those are given'),
	cautions: z.array(text)
});

const depthOfField = z
	.object({
		totalMm: num.nullable().describe('null when the far limit is at infinity'),
		inFrontMm: num,
		behindMm: num.nullable(),
		nearMm: num.optional().describe('thin lens: distance of the near limit from the lens'),
		farMm: num.nullable().optional().describe('thin lens: distance of the far limit; null at infinity'),
		subjectDistanceMm: num.optional().describe('thin lens: f(1 + 1/m)'),
		formula: z.enum(['thin-lens', 'close-up']).describe('thin-lens when focalLengthMm is given (H = f²/(Nc) + f, near s(H − f)/(H + s − 2f), far s(H − f)/(H − s)); else close-up, split evenly')
	})
	.describe('the depth of field with its near and far parts, and which formula answered');

const cocFrom = z.enum(['given', 'sensor-diagonal', 'pixel-pitch', 'default']).describe('given cocMm; the sensor diagonal / 1500; two pixel pitches (cocBasis "pixel"); or 0.03 mm');

export const opticsAnswer = z.object({
	workingAperture: num.describe('N × (1 + m/P)'),
	lightLossStops: num.describe('2·log2(1 + m/P)'),
	bellowsFactor: num,
	dofMm: num.describe('total depth of field, close-up approximation: 2·N·c·(1 + m/P) / m² (2·N_w·c / m² for any magnificationBy)'),
	depthOfField,
	airyDiskUm: num.describe('2.44 · λ · working aperture'),
	diffractionLimited: z.boolean().describe('the Airy disk is larger than the circle of confusion: diffraction softens detail at this sensor'),
	diffractionLimitAperture: num.describe('the marked aperture where the Airy disk reaches the circle of confusion'),
	cocMm: num.describe('the circle of confusion used'),
	cocFrom,
	diffractionNote: text.describe('what diffractionLimited means, in words'),
	extensionMm: num.optional(),
	subjectDistanceMm: num.optional(),
	stack: z
		.object({ frames: z.int(), stepMm: num })
		.optional()
		.describe('with subjectDepthMm: stepMm = dofMm × (1 − overlap), frames = max(1, ceil((subjectDepthMm − dofMm) / stepMm) + 1)'),
	balancedAperture: z.object({ workingAperture: num, markedAperture: num, blurUm: num }).optional()
});

const markedShutter = z.object({ label: text, exactS: num, residualStops: num });

export const ambientAnswer = z.object({
	ev100: num.describe('EV at ISO 100; from incident lux E: log2(E · 100 / C)'),
	ev100From: z.enum(['ev100', 'illuminance', 'luminance', 'skyPreset', 'meter']),
	illuminanceLux: num,
	workingAperture: num,
	exposureOffsetStops: num.optional().describe('ev100 + log2(ISO/100) + log2(shutter) − 2·log2(workingAperture) − lossStops'),
	shutterForCorrect: num.describe('seconds'),
	shutterForBalance: num.optional(),
	markedShutterForCorrect: markedShutter.optional(),
	markedShutterForBalance: markedShutter.optional(),
	balanceFasterThanSync: z.boolean().optional(),
	balanceSumOffsetStops: num.optional().describe('flash + ambient at the balance shutter, stops against correct: flashOffsetStops + log2(1 + 2^(−balanceUnderStops))'),
	flashCompensationStops: num.optional().describe('−log2(1 + 2^(−balanceUnderStops)): the flash compensation that makes the sum correct'),
	shutterForCompensatedBalance: num.optional().describe('seconds: keeps the ambient balanceUnderStops under the flash once that compensation is set')
});

const whiteBalance = z.object({ kelvin: num, spreadMired: num, mixed: z.boolean() });

export const colourAnswer = z.object({
	miredShift: num.optional().describe('10⁶/toKelvin − 10⁶/fromKelvin'),
	nearestGel: z.object({ name: text, label: text, mired: num, residualMired: num }).optional(),
	suggestedGel: z
		.object({ gels: z.array(text), label: text, mired: num, residualMired: num, lossStops: num })
		.optional()
		.describe('the gel, or two different gels stacked, the trade would use for miredShift, with the light it costs (nominal figures)'),
	gelLossStops: num.optional().describe('the light a named `gel` costs, stops (nominal)'),
	cautions: z.array(text).describe('a gel on a hot lamp or a small flash’s head'),
	resultKelvin: num.optional().describe('10⁶ / (10⁶/kelvin + gelMired)'),
	gelMired: num.optional(),
	whiteBalance: whiteBalance.nullable().optional(),
	warnings: z.array(text)
});

const stopsOrNull = num.nullable();
const faceExposure = z.object({ x: num, exposureOffsetStops: stopsOrNull, normal: z.tuple([num, num, num]) });

export const exposureAnswer = z.object({
	workingAperture: num,
	lights: z.array(
		z.object({
			id: text,
			kind: z.enum(['flash', 'continuous', 'reflector', 'ambient']),
			x: num.describe('exposure units: 1 is a correct exposure'),
			stops: stopsOrNull.describe('log2(x); null when the light gives nothing'),
			blocked: z.boolean(),
			blockedBy: text.optional(),
			sourceBlocked: z.boolean().optional(),
			group: z.enum(['flash', 'ambient']),
			distanceM: num.optional(),
			sourceModel: z
				.enum(['point', 'disc', 'rectangle'])
				.optional()
				.describe('a flash or continuous light: the point law, or a sized source (emitterWidthM × emitterHeightM, emitterDiameterM) nearer than five sizes'),
			depthFalloffStops: num.optional().describe('with subject.depthMm: stops this light gives the subject’s front more than its back'),
			reflectionMissesBy: num.optional().describe('a mirror-like reflector with a normal that returns nothing: metres by which the reflection of its source lands beyond its edge (−1: it faces away)')
		})
	),
	total: z.object({ x: num, exposureOffsetStops: stopsOrNull }),
	keyLightId: text.nullable(),
	lightingRatio: num.nullable(),
	apertureTable: z.array(
		z.object({
			aperture: num,
			label: text,
			workingAperture: num,
			exposureOffsetStops: stopsOrNull,
			flashOffsetStops: stopsOrNull,
			ambientOffsetStops: stopsOrNull,
			dofMm: num.nullable(),
			airyDiskUm: num,
			diffractionLimited: z.boolean()
		})
	),
	whiteBalance: whiteBalance.nullable(),
	faces: z
		.object({
			lit: faceExposure,
			shadow: faceExposure,
			ratio: num.nullable().describe('lit.x / shadow.x; null when nothing reaches the shadow face'),
			ratioConvention: z.enum(['key+fill : fill', 'key : fill']).describe('key+fill : fill when some fill reaches the lit face (a fill near the camera axis), key : fill when none does (a card opposite the key)')
		})
		.nullable()
		.describe('the face toward the key and the shadow face, each 45° to the camera axis (or straight at and away from the key without a camera position), Lambert’s cosine law for each light; null without a key'),
	cocMm: num.describe('the circle of confusion of the aperture table and warnings'),
	cocFrom,
	warnings: z.array(text),
	cautions: z.array(text),
	cautionDetails: z.array(z.object({ code: text, message: text, elementIds: z.array(text) }))
});

export const healthAnswer = z.object({ ok: z.literal(true), db: z.enum(['up', 'down']) });

export const devMailAnswer = z.array(z.object({ to: text, subject: text, text, html: text, receivedAt: dateTime }));

// ---------- the setups API ----------

const derivedFrom = z.object({ setupId: id, revisionNumber }).nullable();

/** What names a setup in a list and on its page: its catalogue fields and its studio. */
const setupCard = {
	id,
	title: text,
	subject: text,
	tags: z.array(text),
	studioId: id,
	studioName: text
};

const setupListItem = z.object({
	...setupCard,
	createdAt: dateTime,
	updatedAt: dateTime,
	revisionNumber,
	derivedFrom,
	thumbnailRevision: revisionNumber.nullable().describe('the revision whose thumbnail to show, or null'),
	gearIds: z.array(id),
	deletedAt: dateTime.optional().describe('trash list only'),
	deletedByName: text.nullable().optional().describe('trash list only')
});

export const setupListAnswer = z.object({ items: z.array(setupListItem), total: z.int(), page: z.int(), pageSize: z.int() });

export const createdAnswer = z.object({ id, revisionNumber: z.literal(1) });

export const revisionNumberAnswer = z.object({ revisionNumber });

export const duplicatedAnswer = z.object({ id, revisionNumber: z.literal(1), derivedFrom: z.object({ setupId: id, revisionNumber }), studioId: id });

export const untrashedAnswer = z.object({ id, revisionNumber });

/** A stored document as read: migrated to the current version; one that no longer validates comes with its issues. */
const storedDocument = {
	document: setupDocumentSchema,
	migratedFrom: z.int().optional().describe('the schemaVersion it was stored in, when older'),
	documentIssues: z.array(z.object({ path: z.array(z.union([text, num])), message: text })).optional(),
	documentTrimmed: z
		.array(z.array(text))
		.optional()
		.describe('paths of parts nested too deep to show (stored before the depth limit), left out of `document`')
};

export const setupAnswer = z.object({
	...setupCard,
	revisionNumber,
	createdAt: dateTime,
	updatedAt: dateTime,
	...storedDocument,
	derivedFrom: z.object({ setupId: id, revisionNumber, title: text.optional() }).nullable(),
	derivatives: z.array(z.object({ id, title: text, subject: text, studioId: id, revisionNumber: revisionNumber.nullable() })),
	thumbnailRevision: revisionNumber.nullable(),
	gearIds: z.array(id),
	canEdit: z.boolean(),
	canDuplicate: z.boolean()
});

const revisionSummary = z.object({
	number: revisionNumber,
	authorName: text.nullable(),
	authorId: text.nullable(),
	createdAt: dateTime,
	message: text,
	parentNumber: revisionNumber.nullable(),
	restoredFrom: revisionNumber.nullable(),
	title: text,
	hasThumbnail: z.boolean()
});

export const revisionsAnswer = z.array(revisionSummary);

export const revisionAnswer = revisionSummary.extend({
	setupId: id,
	subject: text,
	tags: z.array(text),
	isLatest: z.boolean(),
	...storedDocument
});

export const setupExposureAnswer = exposureAnswer.extend({ revisionNumber });

export const setupFileAnswer = setupExportSchema;

// ---------- the gear shelf ----------

export const gearItemAnswer = z.object({
	id,
	studioId: id,
	kind: z.enum(GEAR_KINDS),
	name: text,
	spec: z.record(text, z.unknown()).describe("the kind's specification (see the create body)"),
	notes: text,
	createdAt: dateTime,
	updatedAt: dateTime,
	retiredAt: dateTime.nullable()
});

export const gearShelfAnswer = z.object({ studioId: id, canEdit: z.boolean(), items: z.array(gearItemAnswer) });

export const gearDetailAnswer = gearItemAnswer.extend({ canEdit: z.boolean() });

// ---------- shots ----------

const nullableNum = num.nullable();
const settingSource = z.enum(['exif', 'typed', 'not recorded']);

export const shotAnswer = z.object({
	id,
	setupId: id,
	sessionId: id.nullable(),
	revisionNumber,
	fileName: text,
	contentType: text,
	byteSize: z.int(),
	widthPx: z.int(),
	heightPx: z.int(),
	exif: z
		.object({
			fNumber: nullableNum,
			exposureTimeS: nullableNum,
			iso: nullableNum,
			focalLengthMm: nullableNum,
			flashFired: z.boolean().nullable(),
			flashMode: text.nullable(),
			takenAt: text.nullable(),
			cameraModel: text.nullable(),
			lensModel: text.nullable(),
			rejected: z.array(z.object({ field: text, value: text, reason: text }))
		})
		.describe('what the file’s EXIF recorded; null: not recorded'),
	typed: z.record(text, num).describe('values typed by hand'),
	settings: z.object({
		fNumber: nullableNum,
		exposureTimeS: nullableNum,
		iso: nullableNum,
		focalLengthMm: nullableNum,
		sources: z.record(text, settingSource)
	}),
	createdAt: dateTime,
	deletedAt: dateTime.nullable(),
	images: z.object({ original: text, preview: text, thumbnail: text }),
	predicted: z.object({ offsetStops: nullableNum, reason: text.optional() }),
	actual: z
		.object({ offsetStops: num, method: z.enum(['region', 'meter']), meanLuminance: nullableNum, measuredAt: dateTime })
		.nullable(),
	differenceStops: nullableNum.describe('actual − predicted, stops')
});

const sessionTick = z.object({ item: text, tickedAt: dateTime });

export const shotSessionAnswer = z.object({ id, shotOn: text, note: text, ticks: z.array(sessionTick) });

export const shotListAnswer = z.object({
	setupId: id,
	studioId: id,
	latestRevision: revisionNumber,
	canEdit: z.boolean(),
	shots: z.array(shotAnswer),
	sessions: z.array(shotSessionAnswer.extend({ shotCount: z.int(), meanDifferenceStops: nullableNum })),
	meanDifferenceStops: nullableNum
});

export const shotUploadAnswer = z.object({
	created: z.array(shotAnswer),
	failed: z.array(z.object({ fileName: text, message: text.describe('names the file and what is wrong') }))
});

export const checklistAnswer = z.object({ studioId: id, items: z.array(text), canEdit: z.boolean() });

export const calibrationAnswer = z.object({
	id,
	gearId: id,
	method: z.enum(['shot', 'meter', 'typed']),
	guideNumberM: num,
	ratedGuideNumberM: num,
	offsetStops: num,
	shotId: id.nullable(),
	createdAt: dateTime,
	undoneAt: dateTime.nullable(),
	active: z.boolean()
});

export const calibrateAnswer = z.object({ calibration: calibrationAnswer, warnings: z.array(text) });

export const calibrationsAnswer = z.object({ gearId: id, calibrations: z.array(calibrationAnswer) });
