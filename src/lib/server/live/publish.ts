/**
 * Tells every app server that a workshop's live position changed: a NOTIFY on `workshop_live` through
 * the app's own pool. The payload is the position itself (well under PostgreSQL's 8000-byte limit).
 */
import { client } from '$lib/server/db';
import { LIVE_CHANNEL, type LivePosition } from '$lib/present/live-message';

export async function publishLivePosition(position: LivePosition): Promise<void> {
	await client.notify(LIVE_CHANNEL, JSON.stringify(position));
}
