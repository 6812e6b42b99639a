/**
 * The follow page's state: the instructor's live step from the server's event stream, and the step
 * this student is looking at. While following, the shown step is the live one; choosing another step
 * leaves (the live step is still tracked), and "Follow the instructor" rejoins on the live step.
 *
 * EventSource reconnects by itself after a dropped connection (sending Last-Event-ID), but gives up for
 * good on an answer that is not a stream (a 503 while the database restarts): then this opens a new one
 * after the same pause, so a follower recovers without reloading.
 */
import { LIVE_EVENT, parseLivePosition, RETRY_MS, type LivePosition } from './live-message';

export type Connection = 'connecting' | 'open' | 'reconnecting';

/** What this uses of EventSource (the browser's, or a stand-in in tests). */
interface EventSourceLike {
	readonly readyState: number;
	onopen: ((ev: Event) => unknown) | null;
	onerror: ((ev: Event) => unknown) | null;
	addEventListener(type: string, listener: (event: MessageEvent) => void): void;
	close(): void;
}

export interface FollowOptions {
	url: string;
	/** The step ids this page has loaded (a live step outside them asks for fresh data: `onunknown`). */
	knownStepIds: () => ReadonlySet<string>;
	onunknown?: (position: LivePosition) => void;
	/** For tests: the EventSource to use, and the pause before a new one. */
	eventSource?: new (url: string) => EventSourceLike;
	retryMs?: number;
}

export class FollowLive {
	/** The instructor's position (null step: not presenting now); null until the stream says. */
	live = $state.raw<LivePosition | null>(null);
	following = $state(true);
	/** The step shown when not following. */
	#ownStepId = $state<string | null>(null);
	connection = $state<Connection>('connecting');
	/** Live steps received since the page opened (for the screen reader's announcement and tests). */
	received = $state(0);

	readonly #options: FollowOptions;
	#source: EventSourceLike | null = null;
	#retry: ReturnType<typeof setTimeout> | null = null;
	#destroyed = false;

	constructor(options: FollowOptions) {
		this.#options = options;
	}

	/** The step the page shows: the live one while following (else the one chosen). */
	readonly shownStepId = $derived(this.following ? (this.live?.stepId ?? null) : this.#ownStepId);
	readonly liveStepId = $derived(this.live?.stepId ?? null);

	connect() {
		if (this.#destroyed || this.#source) return;
		const Source = this.#options.eventSource ?? (EventSource as unknown as new (url: string) => EventSourceLike);
		const source = new Source(this.#options.url);
		this.#source = source;
		this.connection = 'connecting';
		source.onopen = () => (this.connection = 'open');
		source.onerror = () => {
			// 0 CONNECTING: the browser is reconnecting by itself; 2 CLOSED: it gave up, so open a new one.
			this.connection = 'reconnecting';
			if (source.readyState === 2) {
				source.close();
				this.#source = null;
				this.#retry = setTimeout(() => this.connect(), this.#options.retryMs ?? RETRY_MS);
			}
		};
		source.addEventListener(LIVE_EVENT, (event) => this.#receive(event.data));
	}

	#receive(data: unknown) {
		const position = typeof data === 'string' ? parseLivePosition(data) : null;
		if (!position) return;
		if (this.live && position.at < this.live.at) return;
		this.live = position;
		this.received++;
		if (position.stepId && !this.#options.knownStepIds().has(position.stepId)) this.#options.onunknown?.(position);
	}

	/** Look at another step (leaves the instructor). */
	show(stepId: string) {
		this.#ownStepId = stepId;
		this.following = false;
	}

	/** Stop following but stay on the step shown now. */
	leave() {
		this.#ownStepId = this.shownStepId;
		this.following = false;
	}

	/** Follow the instructor again: lands on the live step. */
	rejoin() {
		this.following = true;
	}

	destroy() {
		this.#destroyed = true;
		if (this.#retry) clearTimeout(this.#retry);
		this.#source?.close();
		this.#source = null;
	}
}
