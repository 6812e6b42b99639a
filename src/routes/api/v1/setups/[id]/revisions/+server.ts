import { json } from '@sveltejs/kit';
import { apiRoute } from '$lib/server/http';
import { listSetupRevisions } from '$lib/server/setups';
import type { RequestHandler } from './$types';

/** Every revision, newest first: `[{ number, authorName, createdAt, message, … }]`. */
export const GET: RequestHandler = apiRoute(async ({ locals, params }) => json(await listSetupRevisions(locals.user, params.id)));
