// `npm start`: install what is missing, start the local database and mail fake, migrate, seed, build
// and serve. Ctrl-C stops everything this command started.
import { ensurePackages, log } from './lib/bootstrap.mjs';

ensurePackages();
const { profiles, startStack, stopper } = await import('./lib/stack.mjs');

const stop = stopper();
stop.exitOnSignals(0);

try {
	const { seeded, child, origin, mail } = await startStack(profiles.dev, stop, { mail: !process.env.EMAIL_SERVER });
	child.on('exit', (code) => {
		if (!stop.stopping) {
			log(`the app stopped (exit ${code})`);
			void stop.stopAll().then(() => process.exit(code ?? 1));
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
	await stop.stopAll();
	process.exit(1);
}
