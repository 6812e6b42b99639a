// `npm run db:migrate` and `npm run db:seed` as an operator runs them: each script as a child process
// against a fresh scratch database made on the test cluster (and dropped afterwards), then the tables,
// the migrations journal and the demo studio are read back. Without DATABASE_URL each says so and fails.
import { execFile } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CLUB_STUDIO_ID, CLUB_STUDIO_NAME, DEMO_USERS } from '$lib/server/seed';

const TEST_URL = process.env.DATABASE_URL;
if (!TEST_URL) throw new Error('DATABASE_URL is not set: these tests run against the real PostgreSQL (run them through `npm test`).');

const root = process.cwd();
const scratchName = `squarelaw_scripts_${randomBytes(4).toString('hex')}`;
const urlOf = (database: string) => Object.assign(new URL(TEST_URL), { pathname: `/${database}` }).toString();
const admin = postgres(urlOf('postgres'), { max: 1, onnotice: () => {} });
let scratch: postgres.Sql;

/** Runs `node scripts/<name>` with the given environment; resolves with its exit code and output. */
function runScript(name: string, env: Record<string, string | undefined>) {
	return new Promise<{ code: number; output: string }>((resolve) => {
		const childEnv = { ...process.env, ...env };
		for (const [k, v] of Object.entries(childEnv)) if (v === undefined) delete childEnv[k];
		execFile(process.execPath, [path.join('scripts', name)], { cwd: root, env: childEnv, timeout: 120_000 }, (error, stdout, stderr) => {
			resolve({ code: error ? ((error as { code?: number }).code ?? 1) : 0, output: stdout + stderr });
		});
	});
}

beforeAll(async () => {
	await admin.unsafe(`create database "${scratchName}"`);
	scratch = postgres(urlOf(scratchName), { max: 1, onnotice: () => {} });
});

afterAll(async () => {
	await scratch?.end();
	await admin.unsafe(`drop database if exists "${scratchName}" with (force)`);
	await admin.end();
});

describe('npm run db:migrate and db:seed', () => {
	it('without DATABASE_URL, each says what to set and exits non-zero', async () => {
		for (const script of ['migrate.mjs', 'seed.mjs']) {
			const { code, output } = await runScript(script, { DATABASE_URL: undefined });
			expect(code, script).not.toBe(0);
			expect(output, script).toContain('DATABASE_URL is not set');
		}
	});

	it('migrate creates every table of a fresh database, and a second run changes nothing', async () => {
		const first = await runScript('migrate.mjs', { DATABASE_URL: urlOf(scratchName) });
		expect(first.code, first.output).toBe(0);
		const tables = (await scratch`select table_name from information_schema.tables where table_schema = 'public'`).map((r) => r.table_name);
		expect(tables).toEqual(expect.arrayContaining(['users', 'sessions', 'studios', 'memberships', 'setups', 'setup_revisions', 'gear']));
		const journal = JSON.parse(fs.readFileSync(path.join(root, 'drizzle', 'meta', '_journal.json'), 'utf8')) as { entries: unknown[] };
		const applied = async () => (await scratch`select count(*)::int as n from drizzle.__drizzle_migrations`)[0].n;
		expect(await applied()).toBe(journal.entries.length);
		const second = await runScript('migrate.mjs', { DATABASE_URL: urlOf(scratchName) });
		expect(second.code, second.output).toBe(0);
		expect(await applied()).toBe(journal.entries.length);
	});

	it('seed writes the demo studio with its people and setups', async () => {
		const { code, output } = await runScript('seed.mjs', { DATABASE_URL: urlOf(scratchName) });
		expect(code, output).toBe(0);
		expect(output).toContain(DEMO_USERS[0].email);
		const [studio] = await scratch`select name from studios where id = ${CLUB_STUDIO_ID}`;
		expect(studio?.name).toBe(CLUB_STUDIO_NAME);
		const emails = (await scratch`select email from users`).map((r) => r.email);
		expect(emails).toEqual(expect.arrayContaining(DEMO_USERS.map((u) => u.email)));
		const [{ n }] = await scratch`select count(*)::int as n from setups where studio_id = ${CLUB_STUDIO_ID}`;
		expect(n).toBeGreaterThan(0);
	});
});
