/**
 * The app server's live hub, made on first use (one LISTEN connection per app server process), and
 * the reading of live positions it needs to catch up after its connection comes back.
 */
import { building } from '$app/environment';
import { env } from '$env/dynamic/private';
import { inArray } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { workshops, type Workshop } from '$lib/server/db/schema';
import type { LivePosition } from '$lib/present/live-message';
import { LiveHub } from './hub';

export { followResponse } from './stream';
export { publishLivePosition } from './publish';

/** A workshop row's live position (`at`: when it was set; 0 when it never was). */
export function positionOf(workshop: Pick<Workshop, 'id' | 'liveLessonId' | 'liveStepId' | 'liveUpdatedAt'>): LivePosition {
	return {
		workshopId: workshop.id,
		lessonId: workshop.liveLessonId,
		stepId: workshop.liveStepId,
		at: workshop.liveUpdatedAt?.getTime() ?? 0
	};
}

/** The live positions of these workshops, for the hub's catch-up (no caller: the followers were let in already). */
export async function readLivePositions(workshopIds: readonly string[]): Promise<LivePosition[]> {
	if (!workshopIds.length) return [];
	const rows = await db
		.select({ id: workshops.id, liveLessonId: workshops.liveLessonId, liveStepId: workshops.liveStepId, liveUpdatedAt: workshops.liveUpdatedAt })
		.from(workshops)
		.where(inArray(workshops.id, [...workshopIds]));
	return rows.map(positionOf);
}

let hub: LiveHub | null = null;

/** This process's hub; the first call starts listening. */
export async function liveHub(): Promise<LiveHub> {
	if (!hub) {
		const url = env.DATABASE_URL;
		if (!url) throw new Error('DATABASE_URL is not set');
		hub = new LiveHub({ databaseUrl: url, readPositions: readLivePositions });
		if (!building && typeof process !== 'undefined') {
			// Open streams would hold adapter-node's graceful shutdown for its whole timeout: end them at
			// once (browsers reconnect, to another server), then close the listening connection.
			const current = hub;
			const endStreams = () => current.closeFollowers();
			process.once('SIGTERM', endStreams);
			process.once('SIGINT', endStreams);
			process.once('sveltekit:shutdown', () => void current.close());
		}
	}
	await hub.listen();
	return hub;
}
