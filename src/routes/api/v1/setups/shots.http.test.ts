// The shots API on the running app, for every route and role: viewers read, editors write, anyone
// outside the studio gets 404 (image URLs included), anonymous 401; bad input names the file or field.
import { beforeAll, describe, expect, it } from 'vitest';
import { api, expectErrorBody, makeStudio, sampleDocument, type TestStudio } from '$lib/server/testing/notebook-fixtures';
import { SAMPLE_EXIF, testImage } from '$lib/server/testing/shot-images';

let studio: TestStudio;
let setupId: string;
let shotId: string;
let sessionId: string;
let flashId: string;

const as = (role: keyof TestStudio['people']) => ({ auth: { kind: 'cookie' as const, who: studio.people[role] } });
const anonymous = { auth: { kind: 'anonymous' as const } };

async function filesForm(files: [string, Uint8Array, string?][]) {
	const form = new FormData();
	for (const [name, bytes, type] of files) form.append('files', new Blob([bytes as Uint8Array<ArrayBuffer>], { type: type ?? 'image/jpeg' }), name);
	return form;
}

beforeAll(async () => {
	studio = await makeStudio('Shots API studio');
	const created = await api('POST', '/api/v1/setups', { ...as('editor'), body: { studioId: studio.studioId, title: 'Moss on a sill', subject: 'moss', document: sampleDocument() } });
	setupId = created.body.id;
	const upload = await api('POST', `/api/v1/setups/${setupId}/shots`, { ...as('editor'), body: await filesForm([['moss-01.jpg', await testImage({ exif: SAMPLE_EXIF })]]) });
	expect(upload.status, JSON.stringify(upload.body)).toBe(201);
	shotId = upload.body.created[0].id;
	sessionId = (await api('POST', `/api/v1/setups/${setupId}/shots/sessions`, { ...as('editor'), body: { shotOn: '2026-11-30' } })).body.id;
	flashId = (await api('POST', '/api/v1/gear', { ...as('editor'), body: { studioId: studio.studioId, kind: 'flash', name: 'Wren 32', spec: { guideNumberM: 32, lowestPower: 1 / 64, syncSpeedS: 1 / 250 } } })).body.id;
});

describe('every shots route against every role', () => {
	const routes = () => {
		const s = `/api/v1/setups/${setupId}/shots`;
		return [
			{ name: 'list', method: 'GET', path: s, write: false },
			{ name: 'read', method: 'GET', path: `${s}/${shotId}`, write: false },
			{ name: 'preview', method: 'GET', path: `${s}/${shotId}/image/preview`, write: false },
			{ name: 'original', method: 'GET', path: `${s}/${shotId}/image/original`, write: false },
			{ name: 'thumbnail', method: 'GET', path: `${s}/${shotId}/image/thumbnail`, write: false },
			{ name: 'checklist', method: 'GET', path: `${s}/checklist`, write: false },
			{ name: 'update', method: 'PATCH', path: `${s}/${shotId}`, write: true, body: { typed: { focalLengthMm: 100 } } },
			{ name: 'measure', method: 'POST', path: `${s}/${shotId}/measure`, write: true, body: { method: 'meter', meter: { aperture: 16 } } },
			{ name: 'session', method: 'POST', path: `${s}/sessions`, write: true, body: { shotOn: '2026-12-01' } },
			{ name: 'tick', method: 'PATCH', path: `${s}/sessions/${sessionId}`, write: true, body: { ticks: ['Lens on manual focus'] } },
			{ name: 'calibrate', method: 'POST', path: `${s}/calibrate`, write: true, body: { method: 'meter', gearId: flashId, aperture: 8, distanceM: 4, iso: 100, power: 1 } },
			{ name: 'restore', method: 'POST', path: `${s}/${shotId}/restore`, write: true }
		];
	};

	for (const role of ['viewer', 'editor', 'owner', 'admin', 'none'] as const) {
		it(`${role}`, async () => {
			for (const r of routes()) {
				const res = await api(r.method, r.path, { ...as(role), body: r.body });
				const expected = role === 'none' ? 404 : r.write && role === 'viewer' ? 403 : r.name === 'calibrate' ? 201 : r.name === 'session' ? 201 : 200;
				expect(res.status, `${role} ${r.name}: ${JSON.stringify(res.body).slice(0, 200)}`).toBe(expected);
			}
		});
	}

	it('anonymous callers get 401 everywhere', async () => {
		for (const r of routes()) expect((await api(r.method, r.path, { ...anonymous, body: r.body })).status, r.name).toBe(401);
	});

	it('a shot asked for under another setup, or an unknown image, is a 404', async () => {
		const other = await api('POST', '/api/v1/setups', { ...as('editor'), body: { studioId: studio.studioId, title: 'Other', subject: 'x', document: sampleDocument() } });
		expect((await api('GET', `/api/v1/setups/${other.body.id}/shots/${shotId}`, as('editor'))).status).toBe(404);
		expect((await api('GET', `/api/v1/setups/${other.body.id}/shots/${shotId}/image/original`, as('editor'))).status).toBe(404);
		expect((await api('GET', `/api/v1/setups/${setupId}/shots/${shotId}/image/raw`, as('editor'))).status).toBe(404);
		expect((await api('GET', `/api/v1/setups/${setupId}/shots/not-a-uuid`, as('editor'))).status).toBe(404);
	});

	it('serves the original byte for byte, the preview as JPEG', async () => {
		const bytes = await testImage({ exif: SAMPLE_EXIF, width: 120, height: 80 });
		const up = await api('POST', `/api/v1/setups/${setupId}/shots`, { ...as('editor'), body: await filesForm([['exact.jpg', bytes]]) });
		const id = up.body.created[0].id;
		const res = await fetch(`${process.env.TEST_BASE_URL}/api/v1/setups/${setupId}/shots/${id}/image/original`, { headers: { cookie: studio.people.viewer.cookie } });
		expect(res.headers.get('content-type')).toBe('image/jpeg');
		expect(Buffer.from(await res.arrayBuffer()).equals(bytes)).toBe(true);
	});
});

describe('bad input over HTTP', () => {
	it('a batch with bad files: 207, the good one in, each bad one named with what is wrong', async () => {
		const good = await testImage({ exif: SAMPLE_EXIF });
		const busy = await testImage({ width: 200, height: 150, rgb: [10, 200, 60] });
		const res = await api('POST', `/api/v1/setups/${setupId}/shots`, {
			...as('editor'),
			body: await filesForm([
				['ok.jpg', good],
				['half.jpg', busy.subarray(0, busy.length / 2)],
				['empty.jpg', new Uint8Array(0)],
				['sheet.pdf', new TextEncoder().encode('%PDF-1.4'), 'application/pdf'],
				['f0.jpg', await testImage({ exif: { FNumber: '0/1', ISOSpeedRatings: '0' } })]
			])
		});
		expect(res.status).toBe(207);
		expect(res.body.created.map((s: { fileName: string }) => s.fileName)).toEqual(['ok.jpg', 'f0.jpg']);
		expect(res.body.failed.map((f: { message: string }) => f.message)).toEqual([
			expect.stringMatching(/^half\.jpg: the image is truncated or corrupt/),
			'empty.jpg: the file is empty',
			expect.stringMatching(/^sheet\.pdf: this is not an image/)
		]);
		// f/0 and ISO 0 are not taken as settings: "not recorded", with the reason kept.
		const f0 = res.body.created[1];
		expect(f0.settings.sources).toMatchObject({ fNumber: 'not recorded', iso: 'not recorded' });
		expect(f0.exif.rejected.map((r: { field: string }) => r.field).sort()).toEqual(['fNumber', 'iso']);
	});

	it('a file over the size limit (50 MB) is refused by name and nothing of it is stored; the file after it goes in', async () => {
		const before = (await api('GET', `/api/v1/setups/${setupId}/shots`, as('editor'))).body.shots.length;
		const res = await api('POST', `/api/v1/setups/${setupId}/shots`, {
			...as('editor'),
			body: await filesForm([
				['huge.jpg', new Uint8Array(50 * 1024 * 1024 + 1)],
				['after.jpg', await testImage()]
			])
		});
		expect(res.status).toBe(207);
		expect(res.body.failed.map((f: { message: string }) => f.message)).toEqual(['huge.jpg: the file is larger than the limit of 50 MB']);
		expect(res.body.created.map((s: { fileName: string }) => s.fileName)).toEqual(['after.jpg']);
		expect((await api('GET', `/api/v1/setups/${setupId}/shots`, as('editor'))).body.shots.length).toBe(before + 1);
	});

	it('a form cut off part-way is a 400 naming files, and nothing is stored', async () => {
		const before = (await api('GET', `/api/v1/setups/${setupId}/shots`, as('editor'))).body.shots.length;
		const whole = new Request('http://127.0.0.1/', { method: 'POST', body: await filesForm([['cut.jpg', await testImage()]]) });
		const body = new Uint8Array(await whole.arrayBuffer());
		const res = await fetch(`${process.env.TEST_BASE_URL}/api/v1/setups/${setupId}/shots`, {
			method: 'POST',
			headers: { cookie: studio.people.editor.cookie, origin: process.env.TEST_BASE_URL!, 'content-type': whole.headers.get('content-type')! },
			body: body.subarray(0, body.length - 100)
		});
		expectErrorBody({ status: res.status, body: await res.json(), headers: res.headers }, 400, 'files');
		expect((await api('GET', `/api/v1/setups/${setupId}/shots`, as('editor'))).body.shots.length).toBe(before);
	});

	it('a field with text PostgreSQL cannot store (a NUL) is a 400 naming it, as the request edge answers for other forms', async () => {
		const form = await filesForm([['a.jpg', await testImage()]]);
		form.append('note', 'grey card\u0000');
		expectErrorBody(await api('POST', `/api/v1/setups/${setupId}/shots`, { ...as('editor'), body: form }), 400, 'note');
	});

	it('a body that is not multipart is a 415; no files is a 400 naming files; bad fields name themselves', async () => {
		expectErrorBody(await api('POST', `/api/v1/setups/${setupId}/shots`, { ...as('editor'), body: { files: [] } }), 415, 'files');
		expectErrorBody(await api('POST', `/api/v1/setups/${setupId}/shots`, { ...as('editor'), body: new FormData() }), 400, 'files');
		const form = await filesForm([['a.jpg', await testImage()]]);
		form.append('revisionNumber', '0');
		expectErrorBody(await api('POST', `/api/v1/setups/${setupId}/shots`, { ...as('editor'), body: form }), 400, 'revisionNumber');
		expectErrorBody(await api('POST', `/api/v1/setups/${setupId}/shots/${shotId}/measure`, { ...as('editor'), body: { method: 'region', region: { x: 0.8, y: 0, width: 0.5, height: 0.5 } } }), 400, 'region.width');
		expectErrorBody(await api('PATCH', `/api/v1/setups/${setupId}/shots/${shotId}`, { ...as('editor'), body: { typed: { iso: 0 } } }), 400, 'typed.iso');
		expectErrorBody(await api('PATCH', `/api/v1/setups/${setupId}/shots/sessions/${sessionId}`, { ...as('editor'), body: { ticks: ['Not on the list'] } }), 400, 'ticks');
		expectErrorBody(await api('POST', `/api/v1/setups/${setupId}/shots/calibrate`, { ...as('editor'), body: { method: 'meter', gearId: flashId, aperture: 8, distanceM: -1, iso: 100, power: 1 } }), 400, 'distanceM');
	});
});
