// `npm run bench`: speed and size targets, measured against the built server (never by timed tests).
// Each file in scripts/bench/ exports `run({ baseUrl, databaseUrl, log })` and returns its figures.
import fs from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { dataDir, ensurePackages, log, root } from './lib/bootstrap.mjs';

ensurePackages();
const { appEnv, build, prepareDatabase, profiles, seed, serve, startMail } = await import('./lib/stack.mjs');

const profile = profiles.bench;
const only = process.argv.slice(2);
const cleanups = [];
let exitCode = 0;
try {
	const db = await prepareDatabase(profile, { fresh: true });
	if (db.stopCluster) cleanups.push(db.stopCluster);
	await seed(db.url);
	const mail = await startMail(profile);
	cleanups.push(() => mail.stop());
	if (!process.env.SQUARELAW_BENCH_NO_BUILD) build();
	const env = appEnv(profile, { ...db, mail });
	const { child, origin } = await serve(profile, env, { quiet: true });
	cleanups.push(() => new Promise((resolve) => {
		child.once('exit', resolve);
		child.kill('SIGTERM');
		setTimeout(resolve, 5000).unref();
	}));
	const benchDir = path.join(root, 'scripts', 'bench');
	const files = fs.readdirSync(benchDir).filter((f) => f.endsWith('.mjs')).sort();
	const report = {};
	for (const file of files) {
		const name = file.replace(/\.mjs$/, '');
		if (only.length && !only.includes(name)) continue;
		log(`── bench: ${name} ──`);
		const mod = await import(pathToFileURL(path.join(benchDir, file)).href);
		try {
			report[name] = await mod.run({ baseUrl: origin, databaseUrl: db.url, env, log: (m) => log(`  ${m}`) });
		} catch (e) {
			exitCode = 1;
			report[name] = { error: e instanceof Error ? e.message : String(e) };
			log(`  failed: ${report[name].error}`);
		}
	}
	fs.mkdirSync(path.join(dataDir, 'reports'), { recursive: true });
	const out = path.join(dataDir, 'reports', 'bench.json');
	fs.writeFileSync(out, JSON.stringify({ at: new Date().toISOString(), report }, null, 2));
	log(`figures written to .data/reports/bench.json`);
	process.stdout.write(JSON.stringify(report, null, 2) + '\n');
} catch (e) {
	exitCode = 1;
	process.stderr.write(`[squarelaw] ${e instanceof Error ? e.stack : String(e)}\n`);
} finally {
	for (const fn of cleanups.reverse()) await Promise.resolve().then(fn).catch(() => {});
	process.exit(exitCode);
}
