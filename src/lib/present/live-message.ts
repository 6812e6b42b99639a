/**
 * What travels when the instructor moves to a step: the NOTIFY payload between app servers and the
 * Server-Sent Events message to each follower (WHATWG HTML, "Server-sent events": `id:`, `event:`,
 * `data:` lines ending in a blank line; a line starting with ":" is a comment; `retry:` sets the
 * reconnection delay). Shared by the server (which writes them) and the follow page (which reads them).
 */
import { z } from 'zod';

/** The PostgreSQL channel every app server listens on. */
export const LIVE_CHANNEL = 'workshop_live';
/** The SSE event name of a live position. */
export const LIVE_EVENT = 'step';
/** How long a follower's browser waits before reconnecting a dropped stream. */
export const RETRY_MS = 2000;
/** A comment line every so often keeps proxies and load balancers from closing an idle stream. */
export const HEARTBEAT_MS = 15_000;
export const HEARTBEAT = ': heartbeat\n\n';

/** Where the instructor is: a step of a lesson, or nothing (not presenting). `at`: when it was set (ms since 1970). */
export const livePositionSchema = z.object({
	workshopId: z.uuid(),
	lessonId: z.uuid().nullable(),
	stepId: z.uuid().nullable(),
	at: z.number().int().nonnegative()
});
export type LivePosition = z.infer<typeof livePositionSchema>;

/** The event id of a position: its time, so a reconnecting browser's `Last-Event-ID` says what it last had. */
export function liveEventId(position: Pick<LivePosition, 'at'>): string {
	return String(position.at);
}

/** The SSE message of a position. JSON has no line breaks of its own here, so `data:` is one line. */
export function formatLiveEvent(position: LivePosition): string {
	return `id: ${liveEventId(position)}\nevent: ${LIVE_EVENT}\ndata: ${JSON.stringify(position)}\n\n`;
}

/** The first lines of a stream: how long to wait before reconnecting. */
export function formatRetry(ms = RETRY_MS): string {
	return `retry: ${ms}\n\n`;
}

/** The position in an SSE message's data (or a NOTIFY payload); null for anything else. */
export function parseLivePosition(text: string): LivePosition | null {
	try {
		const parsed = livePositionSchema.safeParse(JSON.parse(text));
		return parsed.success ? parsed.data : null;
	} catch {
		return null;
	}
}

/**
 * Whether a reconnecting browser already has `position`: its `Last-Event-ID` is that position's id.
 * Anything else (no header, an older id, a malformed one) gets the position sent again.
 */
export function alreadyHas(lastEventId: string | null, position: LivePosition): boolean {
	return lastEventId !== null && lastEventId.trim() === liveEventId(position);
}
