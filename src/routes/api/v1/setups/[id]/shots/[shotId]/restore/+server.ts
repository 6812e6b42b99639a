import { json } from '@sveltejs/kit';
import { apiRoute } from '$lib/server/http';
import { restoreShot } from '$lib/server/shots';
import type { RequestHandler } from './$types';

/** Takes a shot out of the trash. */
export const POST: RequestHandler = apiRoute(async ({ locals, params }) => json(await restoreShot(locals.user, params.id, params.shotId)));
