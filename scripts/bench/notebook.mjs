// Notebook bench: does the setups list stay fast as a studio grows? Seeds (with SQL generate_series) a
// studio of 10,000 setups with 20 revisions each and a studio of ten setups, then times the list and the
// search through the API with a personal access token, at both sizes. The goal: the large studio's list
// no more than twice as slow as the small one's.
import { createHash, randomBytes } from 'node:crypto';
import postgres from 'postgres';
import { median, percentile, round } from '../lib/stats.mjs';

const LARGE_SETUPS = 10_000;
const SMALL_SETUPS = 10;
const REVISIONS_EACH = 20;
const WARMUP = 30;
const SAMPLES = 200;
const GOAL_RATIO = 2;

/** A document of the size the editor writes (one flash, a card, a plan, notes), the same for every row. */
const DOCUMENT = {
	schemaVersion: 1,
	scene: {
		camera: { iso: 100, aperture: 16, shutter: 0.005, magnification: 0.4, pupilMagnification: 0.8, cocMm: 0.03, syncSpeed: 0.005 },
		subject: { position: [0, 0, 0.04] },
		lights: [
			{ id: 'key', kind: 'flash', position: [-0.3, 0.2, 0.35], guideNumber: 40, power: 0.25, lossStops: 1.7, aim: [0, 0, 0.04], beamAngleDeg: 90, kelvin: 5600 },
			{ id: 'card', kind: 'reflector', position: [0.15, -0.05, 0.08], areaM2: 0.06, reflectance: 0.85, surface: 'diffuse', source: 'key' }
		]
	},
	plan: {
		elements: {
			subject: { kind: 'subject', label: 'Specimen', widthM: 0.09, depthM: 0.07, heightM: 0.08, colour: '#e8e4dc' },
			camera: { kind: 'camera', label: 'Camera', position: [0, -0.42, 0.22], rotationDeg: 90 },
			key: { kind: 'flash', label: 'Flash in softbox', rotationDeg: -35 },
			card: { kind: 'reflector', label: 'White card', widthM: 0.2, depthM: 0.01, rotationDeg: 160, colour: '#ffffff' },
			velvet: { kind: 'background', label: 'Black velvet', position: [0, 0.05, 0], widthM: 0.6, depthM: 0.5, colour: '#141414', locked: true }
		},
		viewport: { center: [0, 0], widthM: 1.2, depthM: 1 }
	},
	notes: '# Bench setup\n\n- Brush the velvet before every session.\n- One flash in the softbox, high at the upper left.\n- White card opposite.',
	gear: []
};

const SUBJECTS = ['quartz', 'ammonite', 'moss', 'geode', 'trilobite', 'calcite', 'fluorite', 'pyrite', 'belemnite', 'crinoid', 'agate', 'garnet', 'lichen', 'fern', 'beetle', 'feather', 'shell', 'coral', 'obsidian', 'malachite'];
const TAGS = ['minerals', 'fossils', 'window light', 'catalogue', 'workshop', 'raking light', 'black velvet', 'fill flash'];


async function seedStudio(sql, { name, count, userId, prefix }) {
	const [studio] = await sql`insert into studios (name) values (${name}) returning id`;
	await sql`insert into memberships (studio_id, user_id, role) values (${studio.id}, ${userId}, 'owner')`;
	// Titles mix a subject word, a number and a prefix, so a search for one subject matches 1 in 20 and a
	// search for one number matches a handful.
	await sql`
		insert into setups (studio_id, title, subject, tags, latest_revision, search_text, created_by_id, created_at, updated_at)
		select ${studio.id}, t.title, t.subject, t.tags, ${REVISIONS_EACH},
			lower(t.title || ' ' || t.subject || ' ' || array_to_string(t.tags, ' ')),
			${userId}, now() - (i * interval '3 minutes') - interval '20 hours', now() - (i * interval '3 minutes')
		from generate_series(1, ${count}) as i,
			lateral (select
				initcap((${sql.array(SUBJECTS)}::text[])[1 + i % ${SUBJECTS.length}]) || ' ' || ${prefix} || '-' || lpad(i::text, 5, '0') as title,
				(${sql.array(SUBJECTS)}::text[])[1 + i % ${SUBJECTS.length}] || ' specimen ' || i as subject,
				array[(${sql.array(TAGS)}::text[])[1 + i % ${TAGS.length}], (${sql.array(TAGS)}::text[])[1 + (i / 7) % ${TAGS.length}]] as tags
			) as t`;
	await sql`
		insert into setup_revisions (setup_id, number, parent_number, document, title, subject, tags, author_id, message, created_at)
		select s.id, n, nullif(n - 1, 0), ${sql.json(DOCUMENT)}, s.title, s.subject, s.tags, ${userId}, 'Bench revision ' || n,
			s.created_at + n * interval '1 minute'
		from setups s cross join generate_series(1, ${REVISIONS_EACH}) as n
		where s.studio_id = ${studio.id}`;
	return studio.id;
}

async function timedGet(url, headers) {
	const t0 = performance.now();
	const res = await fetch(url, { headers });
	const body = await res.json();
	const ms = performance.now() - t0;
	if (res.status !== 200) throw new Error(`${url} answered ${res.status}: ${JSON.stringify(body)}`);
	return { ms, body };
}

/**
 * Times two URLs with their requests interleaved (alternating which goes first), so that load from
 * anything else on the machine falls on both alike and the ratio stays meaningful.
 */
async function timePair(urlA, urlB, token, samples) {
	const headers = { authorization: `Bearer ${token}` };
	let lastA = null;
	let lastB = null;
	for (let i = 0; i < WARMUP; i++) {
		lastA = (await timedGet(urlA, headers)).body;
		lastB = (await timedGet(urlB, headers)).body;
	}
	const a = [];
	const b = [];
	for (let i = 0; i < samples; i++) {
		if (i % 2 === 0) {
			a.push((await timedGet(urlA, headers)).ms);
			b.push((await timedGet(urlB, headers)).ms);
		} else {
			b.push((await timedGet(urlB, headers)).ms);
			a.push((await timedGet(urlA, headers)).ms);
		}
	}
	const summary = (ms, last) => ({ medianMs: round(median(ms)), p95Ms: round(percentile(ms, 0.95)), total: last.total, items: last.items.length });
	return [summary(a, lastA), summary(b, lastB)];
}

export async function run({ baseUrl, databaseUrl, log }) {
	const sql = postgres(databaseUrl, { max: 2, onnotice: () => {} });
	try {
		const started = Date.now();
		const run = randomBytes(3).toString('hex');
		const [user] = await sql`
			insert into users (email, name, email_verified) values (${`bench-${run}@bench.example`}, 'Bench owner', now()) returning id`;
		const secret = `slw_${randomBytes(32).toString('base64url')}`;
		await sql`
			insert into access_tokens (user_id, name, token_hash, token_prefix)
			values (${user.id}, 'notebook bench', ${createHash('sha256').update(secret).digest('hex')}, ${secret.slice(0, 10)})`;

		log(`seeding ${LARGE_SETUPS} setups × ${REVISIONS_EACH} revisions and ${SMALL_SETUPS} setups…`);
		const large = await seedStudio(sql, { name: `Bench large ${run}`, count: LARGE_SETUPS, userId: user.id, prefix: 'L' });
		const small = await seedStudio(sql, { name: `Bench small ${run}`, count: SMALL_SETUPS, userId: user.id, prefix: 'S' });
		await sql`vacuum analyze setups`;
		await sql`vacuum analyze setup_revisions`;
		const [{ revisions }] = await sql`select count(*)::int as revisions from setup_revisions`;
		const seedSeconds = round((Date.now() - started) / 1000);
		log(`seeded in ${seedSeconds} s (${revisions} revisions in the database)`);

		const list = (studio, query = '') => `${baseUrl}/api/v1/setups?studio=${studio}&pageSize=20${query}`;
		const cases = {
			list: '',
			listPage10: '&page=10',
			searchSubject: '&q=ammonite',
			searchRare: '&q=trilobite%20-00004',
			tag: '&tag=fossils',
			sortTitle: '&sort=title'
		};
		const figures = {};
		for (const [name, query] of Object.entries(cases)) {
			const [big, little] = await timePair(list(large, query), list(small, query), secret, SAMPLES);
			figures[name] = {
				large: big,
				small: little,
				ratio: round(big.medianMs / little.medianMs)
			};
			log(
				`${name.padEnd(14)} large ${String(big.medianMs).padStart(6)} ms (p95 ${big.p95Ms}, ${big.total} found)   small ${String(little.medianMs).padStart(6)} ms (p95 ${little.p95Ms}, ${little.total} found)   ratio ${figures[name].ratio}`
			);
		}
		const ratio = figures.list.ratio;
		const goalMet = ratio <= GOAL_RATIO;
		log(`list: the ${LARGE_SETUPS}-setup studio is ${ratio}× the ${SMALL_SETUPS}-setup studio (goal ≤ ${GOAL_RATIO}×): ${goalMet ? 'met' : 'NOT met'}`);
		return {
			sizes: { largeSetups: LARGE_SETUPS, smallSetups: SMALL_SETUPS, revisionsEach: REVISIONS_EACH, revisionsInDatabase: revisions },
			seedSeconds,
			samplesEach: SAMPLES,
			figures,
			listRatio: ratio,
			goalRatio: GOAL_RATIO,
			goalMet
		};
	} finally {
		await sql.end({ timeout: 5 });
	}
}
