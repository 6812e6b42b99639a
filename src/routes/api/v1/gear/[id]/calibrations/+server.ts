import { json } from '@sveltejs/kit';
import { apiRoute } from '$lib/server/http';
import { listCalibrations } from '$lib/server/calibrations';
import type { RequestHandler } from './$types';

/** A flash's calibrations, newest first, the one in force marked. */
export const GET: RequestHandler = apiRoute(async ({ locals, params }) => json(await listCalibrations(locals.user, params.id)));
