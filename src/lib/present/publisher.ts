/**
 * Sends the projector's step to the server without ever holding up a step change: the newest step
 * wins (steps passed over while a request was out are never sent), and a step that could not be sent
 * (the network, or the database restarting: a 503) is sent again after a pause until it goes through
 * or a newer one replaces it. A refusal (4xx) stops it, with the reason kept for the page.
 */
export type SendOutcome = { ok: true } | { ok: false; retry: boolean; message: string };

export type PublisherState = 'idle' | 'sending' | 'retrying' | 'refused';

export interface PublisherOptions {
	send: (stepId: string | null) => Promise<SendOutcome>;
	retryMs?: number;
	onchange?: (state: PublisherState, message: string | null) => void;
	wait?: (ms: number) => Promise<void>;
}

const NOTHING = Symbol('nothing pending');

export class LivePublisher {
	#pending: string | null | typeof NOTHING = NOTHING;
	#running = false;
	#state: PublisherState = 'idle';
	#message: string | null = null;
	readonly #options: PublisherOptions;

	constructor(options: PublisherOptions) {
		this.#options = options;
	}

	get state(): PublisherState {
		return this.#state;
	}
	get message(): string | null {
		return this.#message;
	}

	/** The step to publish now (null: the presentation ended). Returns at once. */
	publish(stepId: string | null) {
		this.#pending = stepId;
		if (!this.#running) void this.#run();
	}

	/** Resolves once nothing is waiting to be sent (for tests and for closing the view). */
	async settled(): Promise<void> {
		while (this.#running) await delay(10);
	}

	#set(state: PublisherState, message: string | null = null) {
		this.#state = state;
		this.#message = message;
		this.#options.onchange?.(state, message);
	}

	async #run() {
		this.#running = true;
		try {
			while (this.#pending !== NOTHING) {
				const stepId = this.#pending;
				this.#pending = NOTHING;
				this.#set('sending');
				let outcome: SendOutcome;
				try {
					outcome = await this.#options.send(stepId);
				} catch (e) {
					outcome = { ok: false, retry: true, message: e instanceof Error ? e.message : String(e) };
				}
				if (outcome.ok) {
					this.#set('idle');
					continue;
				}
				if (!outcome.retry) {
					this.#set('refused', outcome.message);
					this.#pending = NOTHING;
					return;
				}
				this.#set('retrying', outcome.message);
				await (this.#options.wait ?? delay)(this.#options.retryMs ?? 2000);
				// Send it again unless a newer step came meanwhile.
				if (this.#pending === NOTHING) this.#pending = stepId;
			}
		} finally {
			this.#running = false;
		}
	}
}

function delay(ms: number) {
	return new Promise<void>((resolve) => setTimeout(resolve, ms));
}
