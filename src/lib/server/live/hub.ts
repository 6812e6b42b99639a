/**
 * The live fan-out of one app server: which followers are connected to which workshop, and one
 * dedicated PostgreSQL connection that LISTENs on `workshop_live`. A step change anywhere is a NOTIFY
 * (`publishLivePosition`), which PostgreSQL hands to every app server's listener; each hands it to its
 * own followers of that workshop. Nothing but the followers' streams is kept in memory, so any number of
 * app servers can stand behind a load balancer.
 *
 * postgres.js's `listen` runs on a connection of its own and LISTENs again by itself after that
 * connection drops (checked by stopping the database for 5 s and for 22 s: it listens again as soon as
 * the database accepts connections, and calls `onlisten` each time). NOTIFYs sent while nobody listened
 * are lost, so every `onlisten` reads the live positions of the workshops followed here and sends each
 * follower whatever is newer than what it has: followers recover from a database restart on the
 * stream they already hold.
 */
import postgres from 'postgres';
import { formatLiveEvent, HEARTBEAT, HEARTBEAT_MS, LIVE_CHANNEL, parseLivePosition, type LivePosition } from '$lib/present/live-message';

/** One follower's stream: `write` adds to it, `close` ends it. */
export interface FollowerStream {
	write(chunk: Uint8Array): void;
	close(): void;
}

interface Follower {
	stream: FollowerStream;
	/** The time of the newest position sent (older ones arriving late are not sent). */
	lastAt: number;
}

export interface LiveHubOptions {
	databaseUrl: string;
	/** The current positions of these workshops (read after every LISTEN, to catch up on NOTIFYs missed). */
	readPositions: (workshopIds: readonly string[]) => Promise<LivePosition[]>;
	heartbeatMs?: number;
}

const encoder = new TextEncoder();

export class LiveHub {
	readonly #followers = new Map<string, Set<Follower>>();
	readonly #options: LiveHubOptions;
	#sql: postgres.Sql | null = null;
	#listening: Promise<void> | null = null;
	#unlisten: (() => Promise<void>) | null = null;
	#heartbeat: ReturnType<typeof setInterval> | null = null;
	#closed = false;
	/** How many times LISTEN was (re)established: for tests and the bench. */
	listens = 0;

	constructor(options: LiveHubOptions) {
		this.#options = options;
	}

	/** Followers connected here (all workshops). */
	get followerCount(): number {
		let n = 0;
		for (const set of this.#followers.values()) n += set.size;
		return n;
	}

	/** Starts listening (once); resolves when the first LISTEN is in place. */
	listen(): Promise<void> {
		if (this.#closed) return Promise.reject(new Error('the live hub is closed'));
		this.#listening ??= this.#startListening().catch((e) => {
			// Try again with the next follower rather than never.
			this.#listening = null;
			throw e;
		});
		return this.#listening;
	}

	async #startListening() {
		this.#sql = postgres(this.#options.databaseUrl, {
			max: 1,
			// Like the app's pool (db/index.ts): give up on an attempt after 2 s and try again every half
			// second, so the listener is back within about a second of the database.
			connect_timeout: 2,
			backoff: () => 0.5,
			onnotice: () => {}
		});
		const { unlisten } = await this.#sql.listen(
			LIVE_CHANNEL,
			(payload) => {
				const position = parseLivePosition(payload);
				if (position) this.deliver(position);
			},
			() => {
				this.listens++;
				void this.#catchUp();
			}
		);
		this.#unlisten = unlisten;
	}

	/** After every LISTEN: each follower gets its workshop's position if it is newer than what it has. */
	async #catchUp() {
		const ids = [...this.#followers.keys()];
		if (!ids.length) return;
		try {
			for (const position of await this.#options.readPositions(ids)) this.deliver(position);
		} catch {
			// The database went away again; the next LISTEN catches up.
		}
	}

	/**
	 * Adds a follower of a workshop; `since` is the time of the position it already has (-1: none).
	 * Returns what removes it.
	 */
	follow(workshopId: string, stream: FollowerStream, since = -1): () => void {
		const follower: Follower = { stream, lastAt: since };
		let set = this.#followers.get(workshopId);
		if (!set) this.#followers.set(workshopId, (set = new Set()));
		set.add(follower);
		this.#heartbeat ??= setInterval(() => this.#beat(), this.#options.heartbeatMs ?? HEARTBEAT_MS);
		this.#heartbeat.unref?.();
		return () => {
			set.delete(follower);
			if (!set.size && this.#followers.get(workshopId) === set) this.#followers.delete(workshopId);
			if (!this.#followers.size && this.#heartbeat) {
				clearInterval(this.#heartbeat);
				this.#heartbeat = null;
			}
		};
	}

	/** Sends a position to one follower, unless it has a newer one. */
	#offer(follower: Follower, position: LivePosition, chunk: Uint8Array) {
		if (position.at <= follower.lastAt) return;
		follower.lastAt = position.at;
		try {
			follower.stream.write(chunk);
		} catch {
			// The stream closed under us; its cancel removes it.
		}
	}

	/** Sends a position to this server's followers of its workshop (the message encoded once for all). */
	deliver(position: LivePosition) {
		const set = this.#followers.get(position.workshopId);
		if (!set?.size) return;
		const chunk = encoder.encode(formatLiveEvent(position));
		for (const follower of set) this.#offer(follower, position, chunk);
	}

	/** Sends one follower the position read when it connected (the stream's first event). */
	deliverTo(workshopId: string, stream: FollowerStream, position: LivePosition) {
		for (const follower of this.#followers.get(workshopId) ?? []) {
			if (follower.stream === stream) this.#offer(follower, position, encoder.encode(formatLiveEvent(position)));
		}
	}

	/** A follower already has the position of time `at` (its browser said so with Last-Event-ID). */
	markSent(workshopId: string, stream: FollowerStream, at: number) {
		for (const follower of this.#followers.get(workshopId) ?? []) {
			if (follower.stream === stream) follower.lastAt = Math.max(follower.lastAt, at);
		}
	}

	#beat() {
		const chunk = encoder.encode(HEARTBEAT);
		for (const set of this.#followers.values()) {
			for (const follower of set) {
				try {
					follower.stream.write(chunk);
				} catch {
					// closed; removed by its cancel
				}
			}
		}
	}

	/** Ends every follower's stream (their browsers reconnect, to this server or another). */
	closeFollowers() {
		for (const set of this.#followers.values()) {
			for (const follower of set) {
				try {
					follower.stream.close();
				} catch {
					// already closed
				}
			}
		}
		this.#followers.clear();
		if (this.#heartbeat) clearInterval(this.#heartbeat);
		this.#heartbeat = null;
	}

	/** Ends the streams and the listening connection. */
	async close() {
		this.#closed = true;
		this.closeFollowers();
		await this.#unlisten?.().catch(() => {});
		await this.#sql?.end({ timeout: 2 }).catch(() => {});
	}
}
