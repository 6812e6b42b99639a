// Pages bench: are the notebook's pages as fast as their work? Signed in as a seeded user (a session
// cookie made here for Mara Quill, owner of the Fernhill studio), autocannon requests the home page, the
// notebook list and a seeded setup page in alternating rounds on the same server, and compares each
// page's requests per second with the home page's (a page that only renders the layout). Goals: the
// setup page ≥ 0.4 × the home page, the notebook list ≥ 0.6 ×.
import { createHash, randomBytes } from 'node:crypto';
import autocannon from 'autocannon';
import postgres from 'postgres';

const CONNECTIONS = Number(process.env.SQUARELAW_BENCH_PAGE_CONNECTIONS ?? 10);
/** Seconds per page in each round; the rounds rotate the pages so drift in machine load hits all alike. */
const ROUND_S = Number(process.env.SQUARELAW_BENCH_SECONDS ?? 5);
const ROUNDS = Number(process.env.SQUARELAW_BENCH_ROUNDS ?? 3);
const WARMUP_S = 2;
export const GOALS = { notebook: 0.6, setup: 0.4 };
const SEEDED_USER = 'mara.quill@fernhill.example';

function measure(url, cookie, seconds) {
	return new Promise((resolve, reject) => {
		autocannon({ url, headers: { cookie }, connections: CONNECTIONS, duration: seconds }, (err, result) =>
			err ? reject(err) : resolve(result)
		);
	});
}

/** One GET, signed in: the page must answer 200 with the marker that shows it rendered for this user. */
async function check(url, cookie, marker) {
	const res = await fetch(url, { headers: { cookie }, redirect: 'manual' });
	const text = await res.text();
	if (res.status !== 200) throw new Error(`${url} answered ${res.status}`);
	if (!text.includes(marker)) throw new Error(`${url} did not show “${marker}”: not signed in, or not the seeded setup`);
}

export async function run({ baseUrl, databaseUrl, log = console.log }) {
	const sql = postgres(databaseUrl, { max: 1, onnotice: () => {} });
	const sessionToken = randomBytes(32).toString('hex');
	// The sessions table keeps the SHA-256 of the cookie's token (see hashed-sessions.ts).
	const tokenHash = createHash('sha256').update(sessionToken).digest('hex');
	try {
		const [user] = await sql`select id, name from users where email = ${SEEDED_USER}`;
		if (!user) throw new Error(`the seed has no ${SEEDED_USER}`);
		await sql`insert into sessions (session_token, user_id, expires) values (${tokenHash}, ${user.id}, now() + interval '1 hour')`;
		// The seeded setup with the most revisions in the user's shared studio: the page with the most to show.
		const [setup] = await sql`
			select s.id, s.title from setups s
			join memberships m on m.studio_id = s.studio_id and m.user_id = ${user.id}
			join studios st on st.id = s.studio_id and st.personal_owner_id is null
			where s.deleted_at is null
			order by s.latest_revision desc, s.created_at
			limit 1`;
		if (!setup) throw new Error('the seed has no setup in a shared studio');
		const cookie = `authjs.session-token=${sessionToken}`;
		const pages = [
			['home', new URL('/', baseUrl).href, user.name],
			['notebook', new URL('/setups', baseUrl).href, setup.title],
			['setup', new URL(`/setups/${setup.id}`, baseUrl).href, setup.title]
		];
		for (const [, url, marker] of pages) await check(url, cookie, marker);

		log(`autocannon: ${CONNECTIONS} connections, ${ROUNDS} rotating rounds of ${ROUND_S} s per page, after a ${WARMUP_S} s warm-up; setup “${setup.title}”`);
		for (const [, url] of pages) await measure(url, cookie, WARMUP_S);
		const totals = Object.fromEntries(pages.map(([name]) => [name, { requests: 0, seconds: 0, p99: [] }]));
		for (let round = 0; round < ROUNDS; round++) {
			// Rotate the order so no page always runs first (or last) in a round.
			const order = pages.map((_, i) => pages[(i + round) % pages.length]);
			for (const [name, url] of order) {
				const r = await measure(url, cookie, ROUND_S);
				const bad = r.non2xx + r.errors + r.timeouts;
				if (bad > 0) throw new Error(`${url}: ${r.non2xx} non-2xx, ${r.errors} errors, ${r.timeouts} timeouts`);
				totals[name].requests += r.requests.total;
				totals[name].seconds += r.duration;
				totals[name].p99.push(r.latency.p99);
				log(`round ${round + 1}: GET ${new URL(url).pathname}: ${Math.round(r.requests.total / r.duration)} req/s (p99 ${r.latency.p99} ms)`);
			}
		}
		const figures = Object.fromEntries(
			Object.entries(totals).map(([name, t]) => [name, { rps: Math.round(t.requests / t.seconds), p99Ms: Math.max(...t.p99) }])
		);
		const ratio = (name) => Math.round((figures[name].rps / figures.home.rps) * 1000) / 1000;
		const ratios = { notebook: ratio('notebook'), setup: ratio('setup') };
		const met = { notebook: ratios.notebook >= GOALS.notebook, setup: ratios.setup >= GOALS.setup };
		for (const [name] of pages) log(`${name.padEnd(8)} ${String(figures[name].rps).padStart(5)} req/s (p99 ${figures[name].p99Ms} ms)`);
		for (const name of ['notebook', 'setup']) {
			log(`ratio ${name} / home: ${ratios[name]} (goal ≥ ${GOALS[name]}: ${met[name] ? 'met' : 'NOT met'})`);
		}
		return { connections: CONNECTIONS, figures, ratios, goals: GOALS, met: met.notebook && met.setup };
	} finally {
		await sql`delete from sessions where session_token = ${tokenHash}`.catch(() => {});
		await sql.end({ timeout: 5 });
	}
}

// Run alone: `node scripts/bench/pages.mjs <base url> <database url>` against a server already started.
if (import.meta.url === `file://${process.argv[1]}`) {
	const [baseUrl, databaseUrl] = process.argv.slice(2);
	if (!baseUrl || !databaseUrl) {
		console.error('usage: node scripts/bench/pages.mjs <base url> <database url>');
		process.exit(2);
	}
	run({ baseUrl, databaseUrl }).then((r) => console.log(JSON.stringify(r, null, 2)), (e) => {
		console.error(e);
		process.exit(1);
	});
}
