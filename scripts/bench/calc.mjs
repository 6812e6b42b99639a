// Benchmark of the calculation API against the built server: requests per second of
// POST /api/v1/exposure with a six-light scene (moved on every request) and of POST /api/v1/calc/colour,
// measured the same way in one run, and their ratio. Goal: exposure / colour ≥ 0.6 with plain code (zod's
// parse, the engine and JSON.stringify of a 22-row aperture table cost a little beside the framework).
// Called by scripts/bench.mjs with the running server's origin.
import autocannon from 'autocannon';

const CONNECTIONS = Number(process.env.SQUARELAW_BENCH_CONNECTIONS ?? 50);
/** Seconds per route in each round; the rounds alternate the two routes so drift in machine load hits both. */
const ROUND_S = Number(process.env.SQUARELAW_BENCH_SECONDS ?? 5);
const ROUNDS = Number(process.env.SQUARELAW_BENCH_ROUNDS ?? 3);
const WARMUP_S = 2;
export const GOAL_RATIO = 0.6;

/** The Fernhill quartz setup, grown to six lights: two flashes, a lamp, three reflectors, a flag. */
export const sixLightScene = {
	camera: { iso: 200, aperture: 16, shutter: 1 / 160, magnification: 0.5, lossStops: 0.3, syncSpeed: 1 / 200 },
	subject: { position: [0, 0, 0.05] },
	ambient: { ev100: 11, kelvin: 6500 },
	lights: [
		{ id: 'softbox', kind: 'flash', position: [-0.3, 0.1, 0.25], guideNumber: 24, power: 0.25, lossStops: 1, kelvin: 5500 },
		{ id: 'rim', kind: 'flash', position: [0.2, 0.35, 0.3], guideNumber: 20, power: 0.125, aim: [0, 0, 0.05], beamAngleDeg: 60 },
		{ id: 'lamp', kind: 'continuous', position: [0.6, -0.4, 0.5], luxAt1m: 3000, runsHot: false, kelvin: 3200 },
		{ id: 'white-card', kind: 'reflector', position: [0.25, -0.05, 0.1], areaM2: 0.06, reflectance: 0.85, surface: 'diffuse', source: 'softbox', normal: [-1, 0, 0] },
		{ id: 'silver', kind: 'reflector', position: [0, -0.3, 0.1], areaM2: 0.04, reflectance: 0.8, surface: 'specular', source: 'rim' },
		{ id: 'sill', kind: 'reflector', position: [-0.2, -0.25, 0.2], areaM2: 0.1, reflectance: 0.7, surface: 'diffuse', source: 'ambient' }
	],
	flags: [{ id: 'black', from: [0.4, 0.3], to: [0.45, -0.5] }]
};

export const colourBody = { fromKelvin: 5500, toKelvin: 3200 };

/**
 * The six-light scene as someone working the plan sends it: every request moves the lights a little and
 * steps the key's power, so no two requests in a row are alike and nothing can answer from a copy. The
 * camera stays put, as it does while lights are dragged.
 */
export const sixLightVariants = Array.from({ length: 64 }, (_, i) => {
	const scene = structuredClone(sixLightScene);
	for (const light of scene.lights) {
		light.position[0] += (i % 8) * 0.003;
		light.position[1] -= Math.floor(i / 8) * 0.002;
	}
	scene.lights[0].power = [0.25, 0.5, 0.125, 1][i % 4];
	return scene;
});

/** `bodies`: one object sent on every request, or an array sent in turn. */
function measure(baseUrl, path, bodies, seconds) {
	const texts = (Array.isArray(bodies) ? bodies : [bodies]).map((b) => JSON.stringify(b));
	let next = 0;
	return new Promise((resolve, reject) => {
		autocannon(
			{
				url: new URL(path, baseUrl).href,
				method: 'POST',
				headers: { 'content-type': 'application/json' },
				body: texts[0],
				requests: texts.length > 1 ? [{ setupRequest: (req) => ({ ...req, body: texts[next++ % texts.length] }) }] : undefined,
				connections: CONNECTIONS,
				duration: seconds
			},
			(err, result) => (err ? reject(err) : resolve(result))
		);
	});
}

async function check(baseUrl, path, body) {
	const res = await fetch(new URL(path, baseUrl), { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
	if (res.status !== 200) throw new Error(`${path} answered ${res.status}: ${(await res.text()).slice(0, 200)}`);
	return res.json();
}

export async function run({ baseUrl, log = console.log }) {
	const scene = await check(baseUrl, '/api/v1/exposure', sixLightScene);
	if (scene.lights.length !== 7) throw new Error('the six-light scene did not answer six lights and the ambient');
	for (const variant of sixLightVariants) await check(baseUrl, '/api/v1/exposure', variant);
	await check(baseUrl, '/api/v1/calc/colour', colourBody);

	log(`autocannon: ${CONNECTIONS} connections, ${ROUNDS} alternating rounds of ${ROUND_S} s per route, after a ${WARMUP_S} s warm-up`);
	await measure(baseUrl, '/api/v1/exposure', sixLightVariants, WARMUP_S);
	await measure(baseUrl, '/api/v1/calc/colour', colourBody, WARMUP_S);

	const routes = [
		['exposure', '/api/v1/exposure', sixLightVariants],
		['colour', '/api/v1/calc/colour', colourBody]
	];
	const totals = { exposure: { requests: 0, seconds: 0, p99: [] }, colour: { requests: 0, seconds: 0, p99: [] } };
	for (let round = 0; round < ROUNDS; round++) {
		// Alternate which route goes first so neither always gets the quieter half of a round.
		for (const [name, path, body] of round % 2 ? [...routes].reverse() : routes) {
			const r = await measure(baseUrl, path, body, ROUND_S);
			const bad = r.non2xx + r.errors + r.timeouts;
			if (bad > 0) throw new Error(`${path}: ${r.non2xx} non-2xx, ${r.errors} errors, ${r.timeouts} timeouts`);
			totals[name].requests += r.requests.total;
			totals[name].seconds += r.duration;
			totals[name].p99.push(r.latency.p99);
			log(`round ${round + 1}: POST ${path}: ${Math.round(r.requests.total / r.duration)} req/s (p99 ${r.latency.p99} ms)`);
		}
	}
	const rps = (t) => Math.round(t.requests / t.seconds);
	const results = {
		exposure: { rps: rps(totals.exposure), p99: Math.max(...totals.exposure.p99) },
		colour: { rps: rps(totals.colour), p99: Math.max(...totals.colour.p99) }
	};
	log(`POST /api/v1/exposure (six lights, moved on every request): ${results.exposure.rps} req/s`);
	log(`POST /api/v1/calc/colour: ${results.colour.rps} req/s`);
	const exposureRps = results.exposure.rps;
	const colourRps = results.colour.rps;
	const ratio = Math.round((exposureRps / colourRps) * 1000) / 1000;
	log(`ratio exposure / colour: ${ratio} (goal ≥ ${GOAL_RATIO}: ${ratio >= GOAL_RATIO ? 'met' : 'NOT met'})`);
	return {
		exposureRps,
		colourRps,
		ratio,
		goal: GOAL_RATIO,
		met: ratio >= GOAL_RATIO,
		exposureP99Ms: results.exposure.p99,
		colourP99Ms: results.colour.p99
	};
}

// Run alone: `node scripts/bench/calc.mjs http://127.0.0.1:3200` against a server already started.
if (import.meta.url === `file://${process.argv[1]}`) {
	const baseUrl = process.argv[2] ?? process.env.TEST_BASE_URL;
	if (!baseUrl) {
		console.error('usage: node scripts/bench/calc.mjs <base url>');
		process.exit(2);
	}
	run({ baseUrl }).then((r) => console.log(JSON.stringify(r, null, 2)), (e) => {
		console.error(e);
		process.exit(1);
	});
}
