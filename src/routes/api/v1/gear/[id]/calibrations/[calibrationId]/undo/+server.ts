import { json } from '@sveltejs/kit';
import { apiRoute } from '$lib/server/http';
import { undoCalibration } from '$lib/server/calibrations';
import type { RequestHandler } from './$types';

/** Undoes a calibration: the one before it (or none) is in force again for setups saved from now on. */
export const POST: RequestHandler = apiRoute(async ({ locals, params }) => json(await undoCalibration(locals.user, params.id, params.calibrationId)));
