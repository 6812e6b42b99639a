/**
 * The projector window and the presenter window of one lesson keep in step through a BroadcastChannel
 * (same browser, same origin, no server): the projector announces its state after every change and
 * when the presenter window says hello; the presenter window asks the projector to move, blank or end. The
 * projector alone publishes the live step, so a follower never gets it twice.
 */
import { z } from 'zod';

export const syncMessageSchema = z.discriminatedUnion('type', [
	/** From the projector: where it is (`startedAt`: when presenting began, ms since 1970). */
	z.object({ type: z.literal('state'), index: z.number().int().nonnegative(), blank: z.boolean(), startedAt: z.number() }),
	/** From the presenter window: go to this step. */
	z.object({ type: z.literal('go'), index: z.number().int().nonnegative() }),
	/** From the presenter window: blank the screen, or show it again. */
	z.object({ type: z.literal('blank'), blank: z.boolean() }),
	/** From a presenter window that just opened: what is the state? */
	z.object({ type: z.literal('hello') }),
	/** From the presenter window: end the live session (the projector publishes it and leaves). */
	z.object({ type: z.literal('end') })
]);
export type SyncMessage = z.infer<typeof syncMessageSchema>;

/** One channel per workshop and lesson, so two lessons presented in two tabs do not cross. */
export function syncChannelName(workshopId: string, lessonId: string): string {
	return `squarelaw-present:${workshopId}:${lessonId}`;
}

export interface PresentSync {
	post(message: SyncMessage): void;
	close(): void;
}

/** Opens the channel; `onmessage` gets only well-formed messages. Without BroadcastChannel, a channel that does nothing. */
export function openSync(workshopId: string, lessonId: string, onmessage: (message: SyncMessage) => void): PresentSync {
	if (typeof BroadcastChannel === 'undefined') return { post() {}, close() {} };
	const channel = new BroadcastChannel(syncChannelName(workshopId, lessonId));
	channel.onmessage = (event: MessageEvent) => {
		const parsed = syncMessageSchema.safeParse(event.data);
		if (parsed.success) onmessage(parsed.data);
	};
	return { post: (message) => channel.postMessage(message), close: () => channel.close() };
}
