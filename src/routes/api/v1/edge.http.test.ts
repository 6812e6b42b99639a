// The request edge through HTTP against the running app (TEST_BASE_URL) and its real database: text that
// PostgreSQL cannot store, JSON nested without bound, a stored document no page could render, the error
// shape of an unexpected failure, caching, bodies that are not JSON and form posts from another site.
// Nothing is mocked.
import { beforeAll, describe, expect, it } from 'vitest';
import { eq, inArray, sql } from 'drizzle-orm';
import { parse } from 'devalue';
import { db } from '$lib/server/db';
import { setupRevisions, setups, studios } from '$lib/server/db/schema';
import { api, authHeaders, baseUrl, expectErrorBody, makeStudio, sampleDocument, type TestStudio } from '$lib/server/testing/notebook-fixtures';
import { createSetup } from '$lib/server/setups';
import { setupCreateSchema } from '$lib/scene/inputs';

/** A 1 × 1 PNG. */
const PNG_BASE64 = 'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==';
const NUL = '\u0000';
const LONE = '\ud800';

let studio: TestStudio;
const owner = () => studio.people.owner;
const token = () => ({ kind: 'token' as const, who: owner() });

beforeAll(async () => {
	baseUrl();
	studio = await makeStudio('Edge tests');
});

async function freshSetup(opts: { thumbnail?: boolean } = {}) {
	const { id } = await createSetup(
		owner().user,
		setupCreateSchema.parse({
			studioId: studio.studioId,
			title: 'Edge setup',
			subject: 'Quartz',
			document: sampleDocument(),
			...(opts.thumbnail ? { thumbnailPng: PNG_BASE64 } : {})
		})
	);
	return id;
}

async function latestRevision(id: string) {
	const [row] = await db.select({ n: setups.latestRevision }).from(setups).where(eq(setups.id, id));
	return row.n;
}

/**
 * A setup document as JSON text whose flash carries a field of the editor's future, `sketch`, nested
 * `levels` deep (as text: JSON.stringify itself overflows its stack on such a value).
 */
function documentWithSketch(levels: number, notes = ''): string {
	const sketch = '{"a":'.repeat(levels) + '1' + '}'.repeat(levels);
	return JSON.stringify({ ...sampleDocument({ notes }), gear: [] }).replace('"plan":{}', `"plan":{"elements":{"key":{"kind":"flash","sketch":${sketch}}}}`);
}

/** A form post as a page sends it: `enhance` adds what SvelteKit's `use:enhance` sends. */
async function postForm(path: string, fields: Record<string, string>, { enhance = false, multipart = false, origin = baseUrl() } = {}) {
	let body: FormData | URLSearchParams;
	if (multipart) {
		body = new FormData();
		for (const [k, v] of Object.entries(fields)) body.set(k, v);
	} else {
		body = new URLSearchParams(fields);
	}
	const headers: Record<string, string> = { ...authHeaders({ kind: 'cookie', who: owner() }), origin };
	Object.assign(headers, enhance ? { accept: 'application/json', 'x-sveltekit-action': 'true' } : { accept: 'text/html,application/xhtml+xml' });
	const res = await fetch(`${baseUrl()}${path}`, { method: 'POST', headers, body, redirect: 'manual' });
	return { status: res.status, type: res.headers.get('content-type') ?? '', text: await res.text() };
}

/** The failure a form action sent by `use:enhance` receives, as `$app/forms`' `deserialize` reads it. */
function actionFailure(text: string) {
	const result = JSON.parse(text) as { type: string; status: number; data: string };
	expect(result.type).toBe('failure');
	return { status: result.status, data: parse(result.data) as { action: string; errors: Record<string, string>; values: Record<string, string> } };
}

describe('text PostgreSQL cannot store (NUL, a lone surrogate) is a 400 naming the field', () => {
	for (const [what, bad] of [
		['a NUL', NUL],
		['a lone surrogate', LONE]
	] as const) {
		it(`in every text field of the JSON API: ${what}`, async () => {
			const id = await freshSetup();
			const doc = sampleDocument();
			const gearSpec = { guideNumberM: 40, lowestPower: 1 / 256, syncSpeedS: 1 / 250 };
			const cases: [string, string, unknown, string][] = [
				['POST', '/api/v1/setups', { title: `Quartz${bad}`, subject: 's', document: doc }, 'title'],
				['POST', '/api/v1/setups', { title: 't', subject: `Quartz${bad}`, document: doc }, 'subject'],
				['POST', '/api/v1/setups', { title: 't', subject: 's', tags: [`a${bad}`], document: doc }, 'tags.0'],
				['POST', '/api/v1/setups', { title: 't', subject: 's', document: { ...doc, notes: `Velvet${bad}` } }, 'document.notes'],
				['POST', '/api/v1/setups', { title: 't', subject: 's', document: sampleDocument({ plan: { elements: { key: { label: `Key${bad}` } } } }) }, 'document.plan.elements.key.label'],
				['PUT', `/api/v1/setups/${id}`, { baseRevision: 1, document: { ...doc, notes: `a${bad}b` } }, 'document.notes'],
				['PUT', `/api/v1/setups/${id}`, { baseRevision: 1, document: doc, message: `m${bad}` }, 'message'],
				['PUT', `/api/v1/setups/${id}`, { baseRevision: 1, document: doc, title: `T${bad}` }, 'title'],
				['POST', `/api/v1/setups/${id}/duplicate`, { subject: `Amethyst${bad}` }, 'subject'],
				['POST', '/api/v1/gear', { studioId: studio.studioId, kind: 'flash', name: `Kestrel${bad}`, spec: gearSpec }, 'name'],
				['POST', '/api/v1/gear', { studioId: studio.studioId, kind: 'flash', name: 'Kestrel', spec: gearSpec, notes: `n${bad}` }, 'notes']
			];
			for (const [method, path, body, field] of cases) {
				const res = await api(method, path, { auth: token(), body });
				expectErrorBody(res, 400, field);
				expect(res.body.error.message).toContain(field);
			}
			expect(await latestRevision(id)).toBe(1);
		});
	}

	it('in a setup file, sent as JSON or as a form upload', async () => {
		const id = await freshSetup();
		const file = (await api('GET', `/api/v1/setups/${id}/export`, { auth: token() })).body;
		const bad = JSON.stringify({ ...file, title: `Quartz${NUL}` });
		expectErrorBody(await api('POST', `/api/v1/setups/import?studio=${studio.studioId}`, { auth: token(), body: bad }), 400, 'title');
		const form = new FormData();
		form.set('file', new Blob([JSON.stringify({ ...file, document: { ...file.document, notes: `x${LONE}` } })], { type: 'application/json' }), 'q.squarelaw.json');
		const res = await fetch(`${baseUrl()}/api/v1/setups/import?studio=${studio.studioId}`, {
			method: 'POST',
			headers: { authorization: `Bearer ${owner().token}`, origin: baseUrl() },
			body: form
		});
		expect(res.status).toBe(400);
		expect((await res.json()).error.issues.map((i: { path: string[] }) => i.path.join('.'))).toContain('document.notes');
	});

	it('in a query string, of the API and of a page', async () => {
		expectErrorBody(await api('GET', '/api/v1/setups?q=quartz%00', { auth: token() }), 400, 'q');
		const page = await fetch(`${baseUrl()}/setups?q=%00`, { headers: { ...authHeaders({ kind: 'cookie', who: owner() }), accept: 'text/html' } });
		expect(page.status).toBe(400);
		expect(await page.text()).toContain('q: must not contain the NUL character');
	});

	it("in a page's form action sent by use:enhance: a failure the page shows beside the field, nothing saved", async () => {
		const id = await freshSetup();
		const notes = await postForm(`/setups/${id}?/notes`, { notes: `Velvet${NUL} under the base`, message: '', baseRevision: '1' }, { enhance: true });
		expect(notes.status).toBe(400);
		const failure = actionFailure(notes.text);
		expect(failure.status).toBe(400);
		expect(failure.data.action).toBe('notes');
		expect(failure.data.errors.notes).toMatch(/NUL/);
		expect(failure.data.values.notes).toBe(`Velvet${NUL} under the base`);
		expect(await latestRevision(id)).toBe(1);

		const details = actionFailure((await postForm(`/setups/${id}?/details`, { title: `T${NUL}`, subject: 's', tags: '', baseRevision: '1' }, { enhance: true })).text);
		expect(details.data).toMatchObject({ action: 'details', errors: { title: expect.stringMatching(/NUL/) } });
		const studioName = actionFailure((await postForm('/studios?/create', { name: `Circle${NUL}` }, { enhance: true })).text);
		expect(studioName.data).toMatchObject({ action: 'create', errors: { name: expect.stringMatching(/NUL/) } });
		const tokenName = actionFailure((await postForm('/account?/createToken', { tokenName: `script${NUL}` }, { enhance: true })).text);
		expect(tokenName.data).toMatchObject({ action: 'createToken', errors: { tokenName: expect.stringMatching(/NUL/) } });
		const gearName = await postForm('/gear?/add', { kind: 'flash', studioId: studio.studioId, name: `Kestrel${NUL}`, 'spec.guideNumberM': '40' }, { enhance: true, multipart: true });
		expect(actionFailure(gearName.text).data).toMatchObject({ action: 'add', errors: { name: expect.stringMatching(/NUL/) } });
		expect(await latestRevision(id)).toBe(1);
	});

	it('in a form posted without JavaScript: a 400 page naming the field', async () => {
		const id = await freshSetup();
		const res = await postForm(`/setups/${id}?/notes`, { notes: `a${NUL}`, message: '', baseRevision: '1' });
		expect(res.status).toBe(400);
		expect(res.type).toContain('text/html');
		expect(res.text).toContain('notes: must not contain the NUL character');
		expect(await latestRevision(id)).toBe(1);
	});
});

describe('JSON nested without bound', () => {
	it('a body 10,000 levels deep is a 400, never a 500', async () => {
		const body = '{"title":"t","subject":"s","document":' + '['.repeat(10_000) + ']'.repeat(10_000) + '}';
		expectErrorBody(await api('POST', '/api/v1/setups', { auth: token(), body }), 400);
		const calc = await api('POST', '/api/v1/exposure', { auth: { kind: 'anonymous' }, body: '{"camera":' + '{"a":'.repeat(10_000) + '1' + '}'.repeat(10_001) });
		expectErrorBody(calc, 400);
	});

	it("a plan's loose fields nest at most 32 levels and hold at most 1000 entries: 400 naming the field", async () => {
		for (const levels of [40, 2_000, 10_000]) {
			const body = `{"title":"t","subject":"s","document":${documentWithSketch(levels)}}`;
			const res = await api('POST', '/api/v1/setups', { auth: token(), body });
			expectErrorBody(res, 400);
			expect(res.body.error.issues[0].path.slice(0, 5).join('.')).toBe('document.plan.elements.key.sketch');
		}
		const wide = sampleDocument({ plan: { elements: { key: { kind: 'flash', marks: Array(1001).fill(1) } } } });
		expectErrorBody(await api('POST', '/api/v1/setups', { auth: token(), body: { title: 't', subject: 's', document: wide } }), 400, 'document.plan.elements.key.marks');
	});

	it('a revision stored before the limit, nested too deep to render, still shows: 200, what is too deep left out and said so', async () => {
		const id = await freshSetup();
		for (const levels of [2_000, 10_000]) {
			const n = (await latestRevision(id)) + 1;
			// Written as JSON text straight into the table, as an older server would have stored it.
			const text = documentWithSketch(levels, 'Stored before the limit');
			await db.insert(setupRevisions).values({ setupId: id, number: n, parentNumber: n - 1, document: sql`${text}::jsonb`, title: 'Edge setup', subject: 'Quartz', message: 'deep' });
			await db.update(setups).set({ latestRevision: n }).where(eq(setups.id, id));

			const page = await fetch(`${baseUrl()}/setups/${id}`, { headers: authHeaders({ kind: 'cookie', who: owner() }) });
			const html = await page.text();
			expect(page.status, `${levels} levels`).toBe(200);
			expect(html).toContain('nests too deep to show');
			expect(html).toContain('Stored before the limit');
			const read = await api('GET', `/api/v1/setups/${id}`, { auth: token() });
			expect(read.status).toBe(200);
			expect(read.body.documentTrimmed[0].slice(0, 5)).toEqual(['plan', 'elements', 'key', 'sketch', 'a']);
			expect((await api('GET', `/api/v1/setups/${id}/exposure`, { auth: token() })).status).toBe(200);
			expect((await api('GET', `/api/v1/setups/${id}/revisions/${n}`, { auth: token() })).status).toBe(200);
		}
	});
});

describe('errors, caching and what a JSON route accepts', () => {
	it('an unexpected failure of a JSON route answers in the error shape, whatever the caller accepts', async () => {
		for (const accept of ['application/json', 'text/html', '*/*']) {
			const res = await api('GET', '/api/dev/fail', { auth: { kind: 'anonymous' }, headers: { accept } });
			expectErrorBody(res, 500);
			expect(res.body.error.issues).toEqual([]);
			expect(res.body.error.message).not.toContain('deliberate');
			expect(res.body.errorId).toMatch(/^[0-9a-f-]{36}$/);
		}
	});

	it('answers to a signed-in caller and the notebook API are never cached; a thumbnail keeps its own caching', async () => {
		const id = await freshSetup({ thumbnail: true });
		const cookie = { kind: 'cookie' as const, who: owner() };
		for (const [path, auth] of [
			['/api/v1/setups', token()],
			[`/api/v1/setups/${id}`, cookie],
			[`/api/v1/gear?studio=${studio.studioId}`, token()],
			['/api/v1/setups', { kind: 'anonymous' as const }],
			['/setups', cookie],
			[`/setups/${id}`, cookie],
			['/calc', cookie]
		] as const) {
			const res = await api('GET', path, { auth });
			expect(res.headers.get('cache-control'), `${path} ${auth.kind}`).toBe('no-store');
		}
		const thumb = await api('GET', `/api/v1/setups/${id}/revisions/1/thumbnail`, { auth: token() });
		expect(thumb.status).toBe(200);
		expect(thumb.headers.get('cache-control')).toMatch(/private/);
	});

	it('a JSON route sent a body that is not JSON answers 415 in the error shape', async () => {
		const id = await freshSetup();
		const body = JSON.stringify({ title: 't', subject: 's', document: sampleDocument() });
		for (const type of ['text/plain', 'application/x-www-form-urlencoded', 'application/xml']) {
			expectErrorBody(await api('POST', '/api/v1/setups', { auth: token(), body, headers: { 'content-type': type, origin: baseUrl() } }), 415);
			expectErrorBody(await api('PUT', `/api/v1/setups/${id}`, { auth: token(), body, headers: { 'content-type': type, origin: baseUrl() } }), 415);
		}
		expectErrorBody(await api('POST', '/api/v1/calc/colour', { auth: { kind: 'anonymous' }, body: '{"fromKelvin":3200,"toKelvin":5600}', headers: { 'content-type': 'text/plain', origin: baseUrl() } }), 415);
		expectErrorBody(await api('POST', `/api/v1/setups/import?studio=${studio.studioId}`, { auth: token(), body: '{}', headers: { 'content-type': 'text/csv' } }), 415);
		// JSON with its charset is JSON.
		const ok = await api('POST', '/api/v1/setups', { auth: token(), body, headers: { 'content-type': 'application/json; charset=utf-8' } });
		expect(ok.status).toBe(201);
	});

	it('a form posted from another site is refused: 403, in the error shape under /api/', async () => {
		const evil = 'http://elsewhere.example';
		const apiPost = await fetch(`${baseUrl()}/api/v1/setups`, {
			method: 'POST',
			headers: { ...authHeaders({ kind: 'cookie', who: owner() }), origin: evil, 'content-type': 'text/plain' },
			body: JSON.stringify({ title: 't', subject: 's', document: sampleDocument() })
		});
		expect(apiPost.status).toBe(403);
		const answer = await apiPost.json();
		expect(answer.error.message).toMatch(/Cross-site POST form submissions are forbidden/);
		expect(answer.error.issues).toHaveLength(1);
		const page = await postForm('/studios?/create', { name: 'Forged studio' }, { origin: evil });
		expect(page.status).toBe(403);
		expect(page.text).toMatch(/Cross-site POST form submissions are forbidden/);
		const noOrigin = await fetch(`${baseUrl()}/studios?/create`, {
			method: 'POST',
			headers: { ...authHeaders({ kind: 'cookie', who: owner() }), 'content-type': 'application/x-www-form-urlencoded' },
			body: 'name=Forged',
			redirect: 'manual'
		});
		expect(noOrigin.status).toBe(403);
		expect(await db.select().from(studios).where(inArray(studios.name, ['Forged studio', 'Forged']))).toEqual([]);
	});
});
