import { redirect } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The plan editor moved onto the setup page; old links and bookmarks land there (permanently). */
export const GET: RequestHandler = ({ params, url }) => redirect(308, `/setups/${encodeURIComponent(params.id)}${url.search}`);
