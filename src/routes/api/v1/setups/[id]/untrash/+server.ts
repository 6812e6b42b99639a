import { json } from '@sveltejs/kit';
import { apiRoute } from '$lib/server/http';
import { untrashSetup } from '$lib/server/setups';
import type { RequestHandler } from './$types';

/** Takes a setup out of the trash with all its revisions: 200 `{ id, revisionNumber }`. */
export const POST: RequestHandler = apiRoute(async ({ locals, params }) => json(await untrashSetup(locals.user, params.id)));
