/**
 * Every JSON route of the app, one row each: method, path, who may call it, a summary, the zod
 * schemas of its input (query and body) and of its answer. The OpenAPI document
 * (`GET /api/v1/openapi.json`, read at `/api`) is built from this table, and `openapi.test.ts` fails when
 * a `+server.ts` under `src/routes/api` exports a method that is not here. Adding a route means adding
 * its row (DEVELOPERS.md, "A JSON route").
 */
import { z } from 'zod';
import { ambientCalcSchema, colourCalcSchema, exposureSceneSchema, flashCalcSchema, opticsCalcSchema } from '$lib/light/schema';
import {
	setupCreateSchema,
	setupDuplicateSchema,
	setupListQuerySchema,
	setupRestoreSchema,
	setupSaveSchema
} from '$lib/scene/inputs';
import { gearCreateSchema, gearQuerySchema, gearSpecSchemas, gearUpdateSchema } from '$lib/scene/gear';
import { importQuerySchema, MAX_EXPORT_BYTES, setupExportSchema } from '$lib/scene/export';
import * as answers from './answers';
import { GROUPS, routesOf, type Access, type ApiRoute, type HttpMethod } from './route-types';
import { SHOT_ROUTES } from './shot-routes';

export { GROUPS };
export type { Access, ApiRoute, HttpMethod };

const revisionQuery = z.object({
	revision: z.int().min(1).optional().describe('a revision number; the latest when absent')
});

const gearSpecFields = Object.entries(gearSpecSchemas)
	.map(([kind, schema]) => `\`${kind}\`: ${Object.keys(schema.shape).join(', ')}`)
	.join('; ');

const calc = (path: string, summary: string, body: z.ZodType, answer: z.ZodType, description?: string): ApiRoute => ({
	method: 'post',
	path,
	group: GROUPS.calc.name,
	access: 'public',
	summary,
	description,
	body: { schema: body },
	answer: { status: 200, description: 'The result', schema: answer }
});

const service = routesOf(GROUPS.meta.name, 'public', '/api/v1');
const setup = routesOf(GROUPS.setups.name, 'signed-in', '/api/v1/setups');
const gear = routesOf(GROUPS.gear.name, 'signed-in', '/api/v1/gear');
const dev = routesOf(GROUPS.dev.name, 'development', '/api/dev');

export const API_ROUTES: ApiRoute[] = [
	calc(
		'/api/v1/calc/flash',
		'Flash: effective guide number, the aperture for a correct exposure, and the power for a given aperture',
		flashCalcSchema,
		answers.flashAnswer,
		'Distances in metres; guide numbers in metres at ISO 100 and full power; `aperture` is the marked f-number. With `aperture`, also the exposure offset, the required power and the nearest step of the third-stop power ladder (1/1 to 1/256, or to `lowestPower`). `calibrationOffsetStops` (the gear shelf’s measured offset, + = brighter) scales the guide number by 2^(offset/2). `magnificationBy` says how the magnification is made: `extension` (default, N × (1 + m/P)), `close-up-lens` (no loss), `reversed-lens` (N × (1/P + m)), `camera-shows-working` (no correction); `teleconverterFactor` multiplies the f-number.'
	),
	calc(
		'/api/v1/calc/optics',
		'Optics: working aperture, light loss, close-up depth of field, diffraction and focus-stack frames',
		opticsCalcSchema,
		answers.opticsAnswer,
		'`magnificationBy` and `teleconverterFactor` as for the flash route. With `focalLengthMm` the depth of field also comes from the thin-lens formulae, with its near and far limits. Without `cocMm` the circle of confusion is the sensor diagonal / 1500 (`sensorWidthMm`, `sensorHeightMm`), two pixel pitches (`pixelPitchUm` with `cocBasis: "pixel"`), or 0.03 mm.'
	),
	calc(
		'/api/v1/calc/ambient',
		'Ambient: EV at ISO 100 from a reading, the exposure offset and the shutter for a correct exposure',
		ambientCalcSchema,
		answers.ambientAnswer,
		'Give exactly one reading: `ev100`, `illuminanceLux` (incident, with `calibrationC`), `luminanceCdM2`, `skyPreset` or `meter`.'
	),
	calc(
		'/api/v1/calc/colour',
		'Colour: the mired shift between two colour temperatures, or the result of a gel',
		colourCalcSchema,
		answers.colourAnswer,
		'`fromKelvin` with `toKelvin`, or `kelvin` with `gelMired` (or a named `gel`); `sources` gives the white balance of a mix.'
	),
	calc(
		'/api/v1/exposure',
		'A whole scene: every light at the subject, the total, key light, lighting ratio and the aperture table',
		exposureSceneSchema,
		answers.exposureAnswer,
		'Exposure units: X = 1 is a correct exposure at the working aperture N_w; stops = log2(X). Direct flash: X = (effectiveGuideNumber / (d · N_w))². Continuous: X = luxAt1m / d² × ISO × t / (C · N_w²), C = 250. Ambient: X = 2^ev100 × (ISO/100) × t / N_w². A diffuse reflector is a Lambertian disc of its area lit by its `source` (a light id or "ambient"); a specular one returns reflectance × the source’s X over the whole path. With a `normal`, a specular one lights the subject only where the mirror reflection of its source lands within its extent, over the reflected path. A light whose straight path to the subject crosses a flag, in plan, gives 0. Lambert’s cosine law applies at the subject when it has a `normal`, `facing: "up"`, or a `camera.position` (it then faces the camera); `faces` gives the lit and shadow faces. A flash’s `calibrationOffsetStops` scales its guide number; a light with a size (`emitterWidthM` × `emitterHeightM` or `emitterDiameterM`) nearer than five sizes is an extended Lambertian source (configuration factors of a rectangle or a disc). The aperture table runs in third stops (exact values 2^(k/6)) from minAperture (default 2.8) to maxAperture (default 32).'
	),
	service('get', '/health', 'Whether the app and its database answer', {
		answer: { status: 200, description: 'Up (503 with `db: "down"` when the database does not answer)', schema: answers.healthAnswer }
	}),
	service('get', '/openapi.json', 'This document: the API as OpenAPI 3.1', {
		answer: { status: 200, description: 'The OpenAPI document', schema: z.looseObject({ openapi: z.string() }) }
	}),

	// ---------- setups ----------
	setup('get', '', 'The notebook: setups across the caller’s studios, searched, filtered, sorted and paged', {
		query: setupListQuerySchema,
		answer: { status: 200, description: 'One page of setups', schema: answers.setupListAnswer }
	}),
	setup('post', '', 'A new setup with its first revision', {
		description:
			'`document` is the setup document `{ schemaVersion, scene, plan, notes }`: `scene` is the body of POST /api/v1/exposure; a document with an empty `plan` (`{}`) and empty `notes` is valid, and the editor lays out what the plan lacks. An older `schemaVersion` is migrated. `thumbnailPng` is a PNG as base64 (or a data URL).',
		body: { schema: setupCreateSchema },
		answer: { status: 201, description: 'Created', schema: answers.createdAnswer }
	}),
	setup('get', '/{id}', 'A setup with its latest document and its lineage', {
		answer: { status: 200, description: 'The setup', schema: answers.setupAnswer }
	}),
	setup('put', '/{id}', 'Save: a new revision on top of `baseRevision`', {
		description: 'Every accepted save is a new revision, written in one transaction; a save whose `baseRevision` is not the latest is a 409 with `latestRevision`. A flash the plan draws from the gear shelf (`gearId`) is saved with the calibration in force on the shelf as its `calibrationOffsetStops`, whatever the body says.',
		body: { schema: setupSaveSchema },
		answer: { status: 200, description: 'Saved', schema: answers.revisionNumberAnswer },
		refusals: [409]
	}),
	setup('delete', '/{id}', 'Move a setup to its studio’s trash (restore with …/untrash)', {
		answer: { status: 204, description: 'In the trash' }
	}),
	setup('get', '/{id}/revisions', 'Every revision of a setup, newest first', {
		answer: { status: 200, description: 'The revisions', schema: answers.revisionsAnswer }
	}),
	setup('get', '/{id}/revisions/{n}', 'One revision with its document', {
		answer: { status: 200, description: 'The revision', schema: answers.revisionAnswer }
	}),
	setup('post', '/{id}/revisions/{n}/restore', 'Restore: a new revision that copies revision n', {
		body: { schema: setupRestoreSchema, required: false },
		answer: { status: 200, description: 'Restored as a new revision', schema: answers.revisionNumberAnswer },
		refusals: [409]
	}),
	setup('get', '/{id}/revisions/{n}/thumbnail', 'The PNG thumbnail of revision n’s plan (404 when it has none)', {
		answer: { status: 200, description: 'The PNG; revisions never change, so it may be cached', mediaType: 'image/png' }
	}),
	setup('post', '/{id}/duplicate', 'Duplicate a setup for a new subject, keeping where it came from', {
		body: { schema: setupDuplicateSchema },
		answer: { status: 201, description: 'The new setup', schema: answers.duplicatedAnswer }
	}),
	setup('get', '/{id}/exposure', 'The POST /api/v1/exposure answer for a revision, computed on the server from the stored scene', {
		query: revisionQuery,
		answer: { status: 200, description: 'The exposure', schema: answers.setupExposureAnswer }
	}),
	setup('get', '/{id}/export', 'The setup file of a revision, as a download', {
		description: 'Squarelaw’s own format (src/lib/scene/README.md); import it with POST /api/v1/setups/import.',
		query: revisionQuery,
		answer: { status: 200, description: 'The setup file (an attachment)', schema: answers.setupFileAnswer }
	}),
	setup('post', '/{id}/untrash', 'Take a setup out of the trash with all its revisions', {
		answer: { status: 200, description: 'Restored', schema: answers.untrashedAnswer }
	}),
	setup('get', '/trash', 'Deleted setups the caller may restore, newest deletion first', {
		query: setupListQuerySchema,
		answer: { status: 200, description: 'One page of the trash', schema: answers.setupListAnswer }
	}),
	setup('post', '/import', 'Make a setup from a setup file', {
		description: `The file's text as the body, or a multipart form with the file in \`file\`; at most ${MAX_EXPORT_BYTES / 1024} KiB. A bad file creates nothing.`,
		query: importQuerySchema,
		body: { schema: setupExportSchema, mediaTypes: ['application/json', 'multipart/form-data'] },
		answer: { status: 201, description: 'Created', schema: answers.createdAnswer }
	}),

	...SHOT_ROUTES,

	// ---------- gear ----------
	gear('get', '', 'A studio’s gear shelf (the caller’s personal studio by default)', {
		query: gearQuerySchema,
		answer: { status: 200, description: 'The shelf', schema: answers.gearShelfAnswer }
	}),
	gear('post', '', 'A new item on the gear shelf', {
		description: `\`spec\` holds the fields of its kind: ${gearSpecFields}.`,
		body: { schema: gearCreateSchema },
		answer: { status: 201, description: 'The item', schema: answers.gearItemAnswer }
	}),
	gear('get', '/{id}', 'One item of a gear shelf', {
		answer: { status: 200, description: 'The item', schema: answers.gearDetailAnswer }
	}),
	gear('patch', '/{id}', 'Edit, retire (`retired: true`) or return an item to the shelf', {
		body: { schema: gearUpdateSchema },
		answer: { status: 200, description: 'The item', schema: answers.gearItemAnswer }
	}),
	gear('get', '/{id}/calibrations', 'A flash’s calibrations, newest first, the one in force marked', {
		answer: { status: 200, description: 'The history', schema: answers.calibrationsAnswer }
	}),
	gear('post', '/{id}/calibrations/{calibrationId}/undo', 'Undo the calibration in force; the one before it (or none) applies to saves from now on', {
		answer: { status: 200, description: 'The history', schema: answers.calibrationsAnswer }
	}),

	// ---------- development ----------
	dev('get', '/mail', 'The messages the local mail fake received, newest first (404 when the fake is off)', {
		answer: { status: 200, description: 'The mailbox', schema: answers.devMailAnswer }
	}),
	dev('get', '/fail', 'Fails the way a bug would: a 500 in the error shape with an errorId (404 where the mailbox is closed)', {
		answer: { status: 500, description: 'Always an error', schema: answers.errorAnswer }
	})
];
