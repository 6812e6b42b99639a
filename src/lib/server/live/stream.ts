/**
 * A follower's Server-Sent Events answer: `retry:`, then the workshop's current position (unless the
 * browser's `Last-Event-ID` says it has it), then every position the hub delivers, with a heartbeat
 * comment between. The stream ends when the browser goes (its cancel) or the server stops.
 */
import { alreadyHas, formatRetry, type LivePosition } from '$lib/present/live-message';
import type { FollowerStream, LiveHub } from './hub';

const encoder = new TextEncoder();

/**
 * The follower is added to the hub before the current position is read, so a step change between the
 * two reaches it either way (the hub never sends a position older than one already sent).
 */
export function followResponse(hub: LiveHub, request: Request, workshopId: string, readCurrent: () => Promise<LivePosition>): Response {
	const lastEventId = request.headers.get('last-event-id');
	let leave: (() => void) | null = null;
	const body = new ReadableStream<Uint8Array>({
		start(controller) {
			const stream: FollowerStream = {
				write: (chunk) => controller.enqueue(chunk),
				close: () => {
					leave?.();
					try {
						controller.close();
					} catch {
						// already closed or cancelled
					}
				}
			};
			controller.enqueue(encoder.encode(formatRetry()));
			leave = hub.follow(workshopId, stream);
			readCurrent().then(
				(current) => {
					if (alreadyHas(lastEventId, current)) hub.markSent(workshopId, stream, current.at);
					else hub.deliverTo(workshopId, stream, current);
				},
				// The database is away: end the stream; the browser comes back after `retry`.
				() => stream.close()
			);
		},
		cancel() {
			leave?.();
		}
	});
	return new Response(body, {
		headers: {
			'content-type': 'text/event-stream; charset=utf-8',
			'cache-control': 'no-store',
			// Tells a buffering reverse proxy (nginx) to pass each event on at once.
			'x-accel-buffering': 'no'
		}
	});
}
