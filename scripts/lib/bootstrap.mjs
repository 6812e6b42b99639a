// Set-up shared by `npm start`, `npm test` and `npm run bench`. Uses only Node's built-ins, because on
// a fresh clone it runs before `npm ci` has installed anything.
import { execFileSync, spawn, spawnSync } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
export const dataDir = path.join(root, '.data');
const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

export function log(message) {
	process.stdout.write(`[squarelaw] ${message}\n`);
}

export function fail(message) {
	process.stderr.write(`\n[squarelaw] ${message}\n`);
	process.exit(1);
}

/** Runs a command with inherited output; throws with a plain message when it fails. */
export function run(cmd, args, options = {}) {
	const result = spawnSync(cmd, args, { stdio: 'inherit', cwd: root, ...options });
	if (result.error) throw new Error(`${cmd} could not start: ${result.error.message}`);
	if (result.status !== 0) throw new Error(`${cmd} ${args.join(' ')} exited with ${result.status}`);
}

function mtime(file) {
	try {
		return fs.statSync(file).mtimeMs;
	} catch {
		return 0;
	}
}

/** `npm ci` when node_modules is missing or older than the lock file. */
export function ensurePackages() {
	const marker = path.join(root, 'node_modules', '.package-lock.json');
	const lock = path.join(root, 'package-lock.json');
	if (mtime(marker) && mtime(marker) >= mtime(lock)) return;
	log('installing npm packages (npm ci)…');
	run('npm', ['ci', '--no-audit', '--no-fund']);
}

/** Secrets live in .data/secrets.json, made on first start and never committed. */
export function loadSecrets() {
	fs.mkdirSync(dataDir, { recursive: true });
	const file = path.join(dataDir, 'secrets.json');
	let secrets = {};
	try {
		secrets = JSON.parse(fs.readFileSync(file, 'utf8'));
	} catch {
		/* first start */
	}
	let changed = false;
	for (const key of ['AUTH_SECRET', 'DB_PASSWORD']) {
		if (!secrets[key]) {
			secrets[key] = randomBytes(32).toString('base64url');
			changed = true;
		}
	}
	if (changed) fs.writeFileSync(file, JSON.stringify(secrets, null, 2), { mode: 0o600 });
	return secrets;
}

function aptInstall(packages) {
	if (!isRoot) return false;
	log(`installing ${packages.join(', ')} from Debian's packages (apt-get)…`);
	try {
		run('apt-get', ['update', '-qq']);
		run('apt-get', ['install', '-y', '-qq', ...packages], {
			env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
		});
		return true;
	} catch (e) {
		log(`apt-get failed: ${e.message}`);
		return false;
	}
}

function findPostgresBin() {
	const base = '/usr/lib/postgresql';
	if (!fs.existsSync(base)) return null;
	const versions = fs
		.readdirSync(base)
		.filter((v) => fs.existsSync(path.join(base, v, 'bin', 'initdb')))
		.sort((a, b) => Number(b) - Number(a));
	return versions.length ? path.join(base, versions[0], 'bin') : null;
}

export function ensurePostgresBinaries() {
	let bin = findPostgresBin();
	if (bin) return bin;
	if (aptInstall(['postgresql'])) bin = findPostgresBin();
	if (!bin) {
		fail(
			'PostgreSQL server binaries were not found in /usr/lib/postgresql/*/bin.\n' +
				'Install them with:  sudo apt-get install -y postgresql\n' +
				'or set DATABASE_URL to a PostgreSQL server you already run.'
		);
	}
	return bin;
}

export function ensureChromium() {
	if (fs.existsSync('/usr/bin/chromium')) return '/usr/bin/chromium';
	if (aptInstall(['chromium']) && fs.existsSync('/usr/bin/chromium')) return '/usr/bin/chromium';
	fail('Debian\'s Chromium is needed for the browser tests: sudo apt-get install -y chromium');
}

/** Whether the `postgres` user can write `dir` (every parent must be traversable). */
function postgresCanUse(dir) {
	const r = spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-w', dir, '-a', '-x', dir]);
	return r.status === 0;
}

/**
 * Where the cluster's files live. Normally `.data/postgres`. PostgreSQL refuses to run as root, so as
 * root it runs as the `postgres` user; when that user cannot enter the checkout (a clone under a
 * mode-700 home folder) the cluster goes to /var/lib/squarelaw/<hash of the checkout path and its secret> and
 * `.data/postgres` becomes a symbolic link to it.
 */
function clusterDir(password) {
	const local = path.join(dataDir, 'postgres');
	if (!isRoot) return local;
	let stat = null;
	try {
		stat = fs.lstatSync(local);
	} catch {
		/* not made yet */
	}
	if (stat?.isSymbolicLink()) return fs.realpathSync(local);
	if (!stat) {
		fs.mkdirSync(local, { recursive: true, mode: 0o700 });
		execFileSync('chown', ['postgres:postgres', local]);
	}
	if (postgresCanUse(local)) return local;
	if (stat) fail(`${local} exists but the postgres user cannot use it; remove it and start again.`);
	fs.rmdirSync(local);
	// Keyed by the checkout and its own secrets: a new clone in the same folder (a CI retry) gets a new
	// cluster instead of one whose password it does not know.
	const hash = createHash('sha256').update(`${root}\0${password}`).digest('hex').slice(0, 12);
	const outside = path.join('/var/lib/squarelaw', hash, 'postgres');
	fs.mkdirSync(outside, { recursive: true, mode: 0o700 });
	fs.chmodSync(path.dirname(outside), 0o755);
	fs.chmodSync('/var/lib/squarelaw', 0o755);
	execFileSync('chown', ['postgres:postgres', outside]);
	fs.symlinkSync(outside, local);
	log(`the postgres user cannot enter ${root}; the cluster lives in ${outside} (linked from .data/postgres)`);
	return outside;
}

function asPostgres(bin, args) {
	if (isRoot) return run('runuser', ['-u', 'postgres', '--', bin, ...args], { cwd: '/' });
	return run(bin, args);
}

function pgIsRunning(bin, dir) {
	const args = ['status', '-D', dir];
	const r = isRoot
		? spawnSync('runuser', ['-u', 'postgres', '--', path.join(bin, 'pg_ctl'), ...args], { cwd: '/' })
		: spawnSync(path.join(bin, 'pg_ctl'), args);
	return r.status === 0;
}

/**
 * Makes sure a local cluster runs on 127.0.0.1:port. Returns a stop function when this call started
 * it, or null when it was already running (a second `npm start` reuses it and leaves it up).
 */
export async function ensureCluster({ port, password }) {
	const bin = ensurePostgresBinaries();
	const dir = clusterDir(password);
	if (!fs.existsSync(path.join(dir, 'PG_VERSION'))) {
		log(`creating a PostgreSQL cluster in ${dir}…`);
		const pwfile = path.join(isRoot ? '/tmp' : dataDir, `squarelaw-pw-${process.pid}`);
		fs.writeFileSync(pwfile, password + '\n', { mode: 0o600 });
		if (isRoot) execFileSync('chown', ['postgres:postgres', pwfile]);
		try {
			asPostgres(path.join(bin, 'initdb'), [
				'-D', dir, '-U', 'squarelaw', '--pwfile', pwfile, '--auth', 'scram-sha-256',
				'--encoding', 'UTF8', '--locale', 'C.UTF-8', '--no-instructions'
			]);
		} finally {
			fs.rmSync(pwfile, { force: true });
		}
	}
	if (pgIsRunning(bin, dir)) {
		log(`PostgreSQL already running (${dir})`);
		return null;
	}
	if (await portInUse(port)) {
		fail(
			`Port ${port} on 127.0.0.1 is taken by another program (perhaps a cluster of another checkout).\n` +
				'Set SQUARELAW_DB_PORT to a free port, or set DATABASE_URL to use that server.'
		);
	}
	log(`starting PostgreSQL on 127.0.0.1:${port} (${dir})`);
	const commands = clusterCommands({ port, password });
	run(commands.start[0], commands.start.slice(1), { cwd: '/' });
	return () => {
		log('stopping PostgreSQL');
		try {
			run(commands.stop[0], commands.stop.slice(1), { cwd: '/' });
		} catch (e) {
			log(`could not stop PostgreSQL: ${e.message}`);
		}
	};
}

/**
 * The commands (argument lists, run from `/`) that start and stop the local cluster. `npm test`
 * hands them to the outage test, which stops the test cluster and starts it again.
 */
export function clusterCommands({ port, password }) {
	const bin = ensurePostgresBinaries();
	const dir = clusterDir(password);
	const pgCtl = isRoot ? ['runuser', '-u', 'postgres', '--', path.join(bin, 'pg_ctl')] : [path.join(bin, 'pg_ctl')];
	const options = `-c listen_addresses=127.0.0.1 -p ${port} -c unix_socket_directories= -c fsync=on`;
	return {
		start: [...pgCtl, 'start', '-w', '-t', '60', '-D', dir, '-l', path.join(dir, 'server.log'), '-o', options],
		stop: [...pgCtl, 'stop', '-w', '-m', 'fast', '-D', dir]
	};
}

/** Starts a child process that is stopped with the parent; resolves when `ready` matches its output. */
export function startChild(name, cmd, args, { env, ready, timeoutMs = 60_000, quiet = false } = {}) {
	const child = spawn(cmd, args, { cwd: root, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
	const prefix = (chunk) =>
		chunk
			.toString()
			.split('\n')
			.filter(Boolean)
			.map((line) => `  ${name} | ${line}\n`)
			.join('');
	return new Promise((resolve, reject) => {
		const timer = setTimeout(() => reject(new Error(`${name} did not start within ${timeoutMs / 1000} s`)), timeoutMs);
		const onData = (chunk) => {
			if (!quiet) process.stdout.write(prefix(chunk));
			if (ready && ready.test(chunk.toString())) {
				clearTimeout(timer);
				resolve(child);
			}
		};
		child.stdout.on('data', onData);
		child.stderr.on('data', (chunk) => process.stderr.write(prefix(chunk)));
		child.on('exit', (code) => {
			clearTimeout(timer);
			reject(new Error(`${name} exited with ${code} before it was ready`));
		});
		if (!ready) {
			clearTimeout(timer);
			resolve(child);
		}
	});
}

export async function waitForHttp(url, timeoutMs = 60_000) {
	const until = Date.now() + timeoutMs;
	while (Date.now() < until) {
		try {
			const res = await fetch(url);
			if (res.status < 500) return;
		} catch {
			/* not up yet */
		}
		await new Promise((r) => setTimeout(r, 250));
	}
	throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
}

export function portInUse(port, host = '127.0.0.1') {
	return new Promise((resolve) => {
		const socket = net.connect({ port, host });
		socket.once('connect', () => {
			socket.destroy();
			resolve(true);
		});
		socket.once('error', () => resolve(false));
	});
}
