// Prepared statements (README, "Configuration"): Drizzle's queries are kept as postgres.js prepared
// statements by default, and none is kept with DATABASE_PREPARE=false (a connection pooler in
// transaction mode cannot keep them); on the real database `npm test` starts, one connection each, read
// back from the session's own `pg_prepared_statements` (PostgreSQL documentation, "pg_prepared_statements").
import { describe, expect, it } from 'vitest';
import postgres from 'postgres';
import { connectionOptions, preparingQueries } from './index';

const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set: run these tests through `npm test`.');

/** Runs the same query with a parameter twice, as Drizzle does, and counts the session's prepared statements. */
async function keptStatements(settings: Record<string, string | undefined>) {
	const client = preparingQueries(postgres(url!, { ...connectionOptions(settings), max: 1 }));
	try {
		for (let i = 0; i < 2; i++) expect(await client.unsafe('select $1::int + 1 as two', [1], { prepare: false })).toEqual([{ two: 2 }]);
		const [{ n }] = await client.unsafe("select count(*)::int as n from pg_prepared_statements where statement like 'select $1::int + 1%'");
		return { prepare: client.options.prepare, kept: n as number };
	} finally {
		await client.end({ timeout: 5 });
	}
}

describe('DATABASE_PREPARE', () => {
	it('by default a repeated query is one prepared statement, although Drizzle asks for none', async () => {
		expect(await keptStatements({})).toEqual({ prepare: true, kept: 1 });
	});
	it('DATABASE_PREPARE=false keeps none, and the queries still answer', async () => {
		expect(await keptStatements({ DATABASE_PREPARE: 'false' })).toEqual({ prepare: false, kept: 0 });
	});
});
