import { building } from '$app/environment';
import { env } from '$env/dynamic/private';
import { drizzle } from 'drizzle-orm/postgres-js';
import postgres, { type Sql } from 'postgres';
import * as schema from './schema';

/** postgres.js's settings, from the environment (README, "Configuration"). */
export function connectionOptions(e: Record<string, string | undefined>) {
	return {
		max: Number(e.DATABASE_POOL_SIZE ?? 10),
		// Prepared statements live on one connection: behind a pooler in transaction mode set
		// DATABASE_PREPARE=false (README, Configuration).
		prepare: e.DATABASE_PREPARE !== 'false',
		idle_timeout: 30,
		// While the database is away, fail fast so the app can answer 503 within about two seconds:
		// a connection attempt gives up after 2 s, and a closed connection tries again after a fixed
		// 0.2 s instead of postgres.js's growing backoff (up to 20 s, which held requests for as long).
		connect_timeout: 2,
		backoff: () => 0.2,
		onnotice: () => {}
	};
}

function connect() {
	const url = env.DATABASE_URL;
	if (!url) {
		// Fail fast at start-up, but not while `vite build` analyses the server modules.
		if (building) return postgres('postgres://build-time-placeholder/none', { max: 0 });
		throw new Error('DATABASE_URL is not set: point it at the PostgreSQL database (see README, Configuration).');
	}
	return postgres(url, connectionOptions(env));
}

/**
 * Drizzle runs each query through postgres.js's `unsafe()` with `prepare: false` (drizzle-orm issue
 * #6096), and postgres.js then sends a query with parameters in two round trips (parse and describe,
 * then bind and execute) that PostgreSQL parses and plans afresh every time. Asking for postgres.js's
 * own default instead, a prepared statement kept on each connection per query text, makes a repeated
 * query one round trip. The connection's `prepare` option still decides (`DATABASE_PREPARE=false`
 * behind a pooler in transaction mode); postgres.js ends a connection after 30 to 60 minutes, and its statements with it.
 */
export function preparingQueries(sql: Sql): Sql {
	const unsafe = sql.unsafe;
	sql.unsafe = ((query: string, args?: unknown[], options?: object) => unsafe(query, args as never, { ...options, prepare: true })) as Sql['unsafe'];
	return sql;
}

export const client = preparingQueries(connect());
export const db = drizzle(client, { schema, casing: 'snake_case' });
export type Db = typeof db;
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

if (!building && typeof process !== 'undefined') {
	// adapter-node emits this on SIGTERM/SIGINT; without it the pool keeps `node build` alive.
	process.on('sveltekit:shutdown', () => {
		void client.end({ timeout: 5 });
	});
}
