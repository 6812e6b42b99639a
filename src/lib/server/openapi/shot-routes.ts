/** The shots routes' rows of the route table (`routes.ts`): a setup's photographs, their measures, sessions and checklist. */
import { z } from 'zod';
import {
	calibrationSchema,
	checklistSchema,
	sessionCreateSchema,
	sessionUpdateSchema,
	shotListQuerySchema,
	shotMeasureSchema,
	shotUpdateSchema,
	shotUploadFieldsSchema
} from '$lib/shots/types';
import * as answers from './answers';
import { GROUPS, routesOf, type ApiRoute } from './route-types';

const shot = routesOf(GROUPS.shots.name, 'signed-in', '/api/v1/setups/{id}/shots');

export const SHOT_ROUTES: ApiRoute[] = [
	shot('get', '', 'A setup’s shots (or its trash), shooting sessions and the mean of actual − predicted', {
		query: shotListQuerySchema,
		answer: { status: 200, description: 'The shots', schema: answers.shotListAnswer }
	}),
	shot('post', '', 'Upload shots: one or more files in `files` (JPEG, PNG, TIFF, WebP)', {
		description:
			'A multipart form: `files` (repeat it for several), optionally `sessionId` and `revisionNumber` (the latest by default). 201 when all went in, 207 when some did not, 400 when none did; each failure names its file and what is wrong, and a file is stored whole or not at all. The size limit per file is `SQUARELAW_SHOT_MAX_BYTES` (50 MB). As for every form post, send `Origin` with the app’s own address (a browser does; a script must), or SvelteKit refuses it with 403.',
		body: { schema: shotUploadFieldsSchema.extend({ files: z.array(z.string().describe('a file')) }), mediaTypes: ['multipart/form-data'] },
		answer: { status: 201, description: 'Stored', schema: answers.shotUploadAnswer },
		refusals: [415]
	}),
	shot('get', '/{shotId}', 'One shot: EXIF, typed values, predicted, actual and their difference', {
		answer: { status: 200, description: 'The shot', schema: answers.shotAnswer }
	}),
	shot('patch', '/{shotId}', 'Type values in (null clears one), move the shot to another revision or session', {
		body: { schema: shotUpdateSchema },
		answer: { status: 200, description: 'The shot', schema: answers.shotAnswer }
	}),
	shot('delete', '/{shotId}', 'Move a shot to the trash (restore with …/restore)', {
		answer: { status: 200, description: 'The shot, in the trash', schema: answers.shotAnswer }
	}),
	shot('post', '/{shotId}/restore', 'Take a shot out of the trash', {
		answer: { status: 200, description: 'The shot', schema: answers.shotAnswer }
	}),
	shot('get', '/{shotId}/image/{variant}', 'An image of a shot: `original`, `preview` (1600 px, upright) or `thumbnail` (320 px)', {
		answer: { status: 200, description: 'The image', mediaType: 'image/jpeg' },
		refusals: [503]
	}),
	shot('post', '/{shotId}/measure', 'Measure the actual exposure: a region of the original, or a meter reading', {
		description:
			'`region` is in fractions of the upright picture. The region is decoded to linear light (IEC 61966-2-1), its Rec. 709 luminance averaged, and the offset is log2(mean / 0.18). A camera’s own JPEG tone curve shifts this; a grey card gives the most trustworthy reading.',
		body: { schema: shotMeasureSchema },
		answer: { status: 200, description: 'The shot with its measure', schema: answers.shotAnswer }
	}),
	shot('post', '/calibrate', 'Calibrate a gear-shelf flash from a measured shot or a flash-meter reading', {
		description: 'GN = N × d / (√(ISO/100) · √power · 2^(−loss/2)) for a reading; from a shot, the flash takes the difference between actual and predicted. Setups saved from then on use it; older revisions keep their copy.',
		body: { schema: calibrationSchema },
		answer: { status: 201, description: 'The calibration, and warnings', schema: answers.calibrateAnswer }
	}),
	shot('post', '/sessions', 'A new shooting session (date and note)', {
		body: { schema: sessionCreateSchema },
		answer: { status: 201, description: 'The session', schema: answers.shotSessionAnswer }
	}),
	shot('patch', '/sessions/{sessionId}', 'Change a session’s date or note, and tick its checklist (the whole set of ticked items)', {
		body: { schema: sessionUpdateSchema },
		answer: { status: 200, description: 'The session', schema: answers.shotSessionAnswer }
	}),
	shot('get', '/checklist', 'The pre-shot checklist of the setup’s studio', {
		answer: { status: 200, description: 'The checklist', schema: answers.checklistAnswer }
	}),
	shot('put', '/checklist', 'Replace the studio’s pre-shot checklist (editors and owners)', {
		body: { schema: checklistSchema },
		answer: { status: 200, description: 'The checklist', schema: answers.checklistAnswer }
	}),
];
