// `npm start`: install what is missing, start the local database and mail fake, migrate, seed, build
// and serve. Ctrl-C stops everything this command started.
import { ensurePackages, log } from './lib/bootstrap.mjs';

ensurePackages();
const { appEnv, build, prepareDatabase, profiles, seed, serve, startMail } = await import('./lib/stack.mjs');

const profile = profiles.dev;
const cleanups = [];
let stopping = false;
async function stopAll(code = 0) {
	if (stopping) return;
	stopping = true;
	for (const cleanup of cleanups.reverse()) {
		try {
			await cleanup();
		} catch {
			/* keep stopping the rest */
		}
	}
	process.exit(code);
}
process.on('SIGINT', () => void stopAll(0));
process.on('SIGTERM', () => void stopAll(0));

try {
	const db = await prepareDatabase(profile);
	if (db.stopCluster) cleanups.push(db.stopCluster);
	const seeded = await seed(db.url);
	const mail = process.env.EMAIL_SERVER ? null : await startMail(profile);
	if (mail) cleanups.push(() => mail.stop());
	build();
	const env = appEnv(profile, { ...db, mail });
	const { child, origin } = await serve(profile, env);
	cleanups.push(
		() =>
			new Promise((resolve) => {
				child.once('exit', resolve);
				child.kill('SIGTERM');
				setTimeout(resolve, 5000).unref();
			})
	);
	child.on('exit', (code) => {
		if (!stopping) {
			log(`the app stopped (exit ${code})`);
			void stopAll(code ?? 1);
		}
	});
	const users = seeded?.users ?? [];
	log('');
	log(`Squarelaw is running at ${origin}`);
	log(`Sign in at ${origin}/signin with a demo address, then open ${origin}/dev/mail and click the link:`);
	for (const u of users) log(`  ${u.email.padEnd(34)} ${u.name} (${u.role} of ${u.studio})`);
	// The app's mailbox only answers on a loopback-only server (README, "The local mailbox").
	if (mail) log(`The mail fake's own list, readable on this machine only: ${mail.httpUrl}/messages`);
	log('Press Ctrl-C to stop.');
} catch (e) {
	process.stderr.write(`\n[squarelaw] ${e instanceof Error ? e.message : String(e)}\n`);
	await stopAll(1);
}
