// Which errors mean "the database is away" (answered with 503) and which are anything else.
import net from 'node:net';
import { describe, expect, it } from 'vitest';
import { DatabaseUnreachable, isDatabaseUnreachable } from './unreachable';

const DB_PORT = 5433;

/** A real refused connection to a port nobody listens on, as Node reports it. */
async function refusedConnection(): Promise<Error> {
	const server = net.createServer();
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	const { port } = server.address() as net.AddressInfo;
	await new Promise<void>((resolve) => server.close(() => resolve()));
	return new Promise((resolve) => net.connect(port, '127.0.0.1').on('error', resolve));
}

/** PostgreSQL's error as postgres.js hands it over (a PostgresError carries severity and SQLSTATE). */
function postgresError(code: string) {
	return Object.assign(new Error('server says no'), { name: 'PostgresError', severity: 'FATAL', code });
}

describe('isDatabaseUnreachable', () => {
	it('a refused connection on the database port, bare or wrapped as Drizzle and Auth.js wrap it', async () => {
		const refused = await refusedConnection();
		const port = (refused as Error & { port: number }).port;
		expect(isDatabaseUnreachable(refused, port)).toBe(true);
		const drizzle = new Error('Failed query: select 1', { cause: refused });
		expect(isDatabaseUnreachable(drizzle, port)).toBe(true);
		const authjs = Object.assign(new Error('SessionTokenError'), { cause: { err: new Error('AdapterError', { cause: { err: drizzle } }) } });
		expect(isDatabaseUnreachable(authjs, port)).toBe(true);
		expect(isDatabaseUnreachable(new AggregateError([refused]), port)).toBe(true);
	});

	it('a refused connection elsewhere (the mail server) is not a database outage', async () => {
		const refused = await refusedConnection();
		expect(isDatabaseUnreachable(refused, DB_PORT)).toBe(false);
		expect(isDatabaseUnreachable(new TypeError('fetch failed', { cause: refused }), DB_PORT)).toBe(false);
	});

	it("postgres.js's connection errors", () => {
		for (const code of ['CONNECT_TIMEOUT', 'CONNECTION_CLOSED', 'CONNECTION_ENDED', 'CONNECTION_DESTROYED']) {
			expect(isDatabaseUnreachable(Object.assign(new Error(code), { code }), DB_PORT), code).toBe(true);
		}
	});

	it('a server shutting down, starting up or full (PostgreSQL documentation, Appendix A)', () => {
		for (const code of ['57P01', '57P02', '57P03', '53300', '08006', '08001']) {
			expect(isDatabaseUnreachable(postgresError(code), DB_PORT), code).toBe(true);
		}
	});

	it('errors of a working database, bugs and non-errors are not an outage', () => {
		for (const code of ['23505', '40001', '42P01', '22P02', '3D000']) {
			expect(isDatabaseUnreachable(postgresError(code), DB_PORT), code).toBe(false);
		}
		// The same five characters without PostgreSQL's severity come from somewhere else.
		expect(isDatabaseUnreachable(Object.assign(new Error('x'), { code: '08006' }), DB_PORT)).toBe(false);
		expect(isDatabaseUnreachable(new TypeError('undefined is not a function'), DB_PORT)).toBe(false);
		for (const value of [null, undefined, 'ECONNREFUSED', 42]) expect(isDatabaseUnreachable(value, DB_PORT)).toBe(false);
	});

	it('the marker thrown where Auth.js swallowed the error', () => {
		expect(isDatabaseUnreachable(new DatabaseUnreachable(), DB_PORT)).toBe(true);
	});
});
