// `npm run bench`: speed and size targets, measured against the built server (never by timed tests).
// Each file in scripts/bench/ exports `run({ baseUrl, databaseUrl, log })` and returns its figures.
import fs from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { dataDir, ensurePackages, log, root } from './lib/bootstrap.mjs';

ensurePackages();
const { profiles, startStack, stopper } = await import('./lib/stack.mjs');

const profile = profiles.bench;
const only = process.argv.slice(2);
const stop = stopper();
stop.exitOnSignals(130);
let exitCode = 0;
try {
	const { db, env, origin, child } = await startStack(profile, stop, { fresh: true, quiet: true, build: !process.env.SQUARELAW_BENCH_NO_BUILD });
	const benchDir = path.join(root, 'scripts', 'bench');
	const files = fs.readdirSync(benchDir).filter((f) => f.endsWith('.mjs')).sort();
	const report = {};
	for (const file of files) {
		const name = file.replace(/\.mjs$/, '');
		if (only.length && !only.includes(name)) continue;
		log(`── bench: ${name} ──`);
		const mod = await import(pathToFileURL(path.join(benchDir, file)).href);
		try {
			report[name] = await mod.run({ baseUrl: origin, databaseUrl: db.url, env, appPid: child.pid, log: (m) => log(`  ${m}`) });
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
	await stop.stopAll();
	process.exit(exitCode);
}
