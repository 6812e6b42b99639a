// `npm test`: the same set-up as `npm start` against a separate test database, then the type check,
// vitest (unit and integration tests against the real PostgreSQL and the running app) and Playwright
// in Debian's Chromium. Ends with each runner's summary and a non-zero exit on any failure.
//
// For a quicker loop while working on one thing (never in CI): `npm test -- --only` followed by any of
// `--no-check`, `--vitest=<filter>` and `--playwright=<filter>` (each repeatable; `none` skips that
// runner) runs the same set-up and then only what is named.
import fs from 'node:fs';
import path from 'node:path';
import { spawn } from 'node:child_process';
import { dataDir, ensureChromium, ensurePackages, log, root } from './lib/bootstrap.mjs';

ensurePackages();
const chromium = ensureChromium();
const { profiles, startStack, stopper } = await import('./lib/stack.mjs');

const profile = profiles.test;
const args = process.argv.slice(2);
const partial = args.includes('--only');
const named = (flag) => args.filter((a) => a.startsWith(`--${flag}=`)).map((a) => a.slice(flag.length + 3));
const vitestFilters = named('vitest');
const playwrightFilters = named('playwright');
const runCheck = !partial || !args.includes('--no-check');
const runVitest = !partial || (vitestFilters.length > 0 && !vitestFilters.includes('none'));
const runPlaywright = !partial || (playwrightFilters.length > 0 && !playwrightFilters.includes('none'));
const results = [];
let exitCode = 0;
const stop = stopper();
stop.exitOnSignals(130);

/**
 * Runs one test runner. Asynchronous on purpose: the mail fake lives in this process and must keep
 * answering while the runners send mail through the app.
 */
async function step(name, cmd, args, env) {
	log(`── ${name} ──`);
	const started = Date.now();
	const status = await new Promise((resolve) => {
		const child = spawn(cmd, args, { cwd: root, stdio: 'inherit', env: { ...process.env, ...env } });
		child.on('error', () => resolve(1));
		child.on('exit', (code) => resolve(code ?? 1));
	});
	const ok = status === 0;
	results.push({ name, ok, seconds: Math.round((Date.now() - started) / 1000) });
	if (!ok) exitCode = 1;
	return ok;
}

function readJson(file) {
	try {
		return JSON.parse(fs.readFileSync(file, 'utf8'));
	} catch {
		return null;
	}
}

try {
	const { db, env, child, origin } = await startStack(profile, stop, { fresh: true, quiet: true });
	const out = fs.createWriteStream(path.join(dataDir, 'test-app.log'));
	child.stdout.pipe(out);
	child.stderr.pipe(out);
	log(`test app at ${origin} (its log: .data/test-app.log)`);

	const testEnv = {
		...env,
		NODE_ENV: 'test',
		TEST_BASE_URL: origin,
		CHROMIUM_PATH: chromium,
		// The outage test stops and starts the test cluster with these (unset with DATABASE_URL).
		SQUARELAW_TEST_CLUSTER: db.cluster ? JSON.stringify(db.cluster) : '',
		CI: process.env.CI ?? ''
	};
	const reports = path.join(dataDir, 'reports');
	// A report left by an earlier run must never be read as this run's.
	fs.rmSync(path.join(reports, 'vitest.json'), { force: true });
	fs.rmSync(path.join(reports, 'playwright.json'), { force: true });
	fs.mkdirSync(reports, { recursive: true });

	if (runCheck)
		await step('type check (svelte-check)', 'npx', ['svelte-check', '--tsconfig', './tsconfig.json', '--threshold', 'error'], testEnv);
	if (runVitest)
		await step(
			'unit and integration tests (vitest)',
			'npx',
			['vitest', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${path.join(reports, 'vitest.json')}`, ...vitestFilters],
			testEnv
		);
	if (runPlaywright)
		await step('browser tests (Playwright, Chromium)', 'npx', ['playwright', 'test', '-c', 'tests/playwright.config.ts', ...playwrightFilters], {
			...testEnv,
			PLAYWRIGHT_JSON_OUTPUT_NAME: path.join(reports, 'playwright.json')
		});

	const vitest = readJson(path.join(reports, 'vitest.json'));
	const pw = readJson(path.join(reports, 'playwright.json'));
	let passed = 0;
	let failed = 0;
	let skipped = 0;
	if (vitest) {
		passed += vitest.numPassedTests ?? 0;
		failed += vitest.numFailedTests ?? 0;
		skipped += (vitest.numPendingTests ?? 0) + (vitest.numTodoTests ?? 0);
		log(`vitest: ${vitest.numPassedTests} passed, ${vitest.numFailedTests} failed`);
	} else if (runVitest) {
		exitCode = 1;
		log('vitest wrote no report');
	}
	if (pw?.stats) {
		const pwPassed = (pw.stats.expected ?? 0) + (pw.stats.flaky ?? 0);
		const pwFailed = pw.stats.unexpected ?? 0;
		passed += pwPassed;
		failed += pwFailed;
		skipped += pw.stats.skipped ?? 0;
		log(`playwright: ${pwPassed} passed, ${pwFailed} failed`);
	} else if (runPlaywright) {
		exitCode = 1;
		log('Playwright wrote no report');
	}
	for (const r of results) log(`${r.ok ? 'ok  ' : 'FAIL'} ${r.name} (${r.seconds} s)`);
	if (skipped > 0) {
		log(`${skipped} tests were skipped; a skipped test is a defect here`);
		exitCode = 1;
	}
	if (passed === 0 && (runVitest || runPlaywright)) exitCode = 1;
	process.stdout.write(`\ntotal: ${passed} passed, ${failed} failed\n`);
} catch (e) {
	process.stderr.write(`\n[squarelaw] ${e instanceof Error ? e.stack : String(e)}\n`);
	exitCode = 1;
} finally {
	await stop.stopAll();
	process.exit(exitCode);
}
