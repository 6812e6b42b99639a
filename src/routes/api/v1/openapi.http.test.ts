// The published API against the running app (TEST_BASE_URL): /api/v1/openapi.json serves the document,
// /api shows every route from it without loading anything from elsewhere, and every route in the
// table, called as a client would, answers the status and the fields the document says.
import { beforeAll, describe, expect, it } from 'vitest';
import { api, baseUrl, makeUser, sampleDocument, type TestUser } from '$lib/server/testing/notebook-fixtures';
import { openApiDocument } from '$lib/server/openapi';
import { API_ROUTES, type HttpMethod } from '$lib/server/openapi/routes';
import { SAMPLE_EXIF, testImage } from '$lib/server/testing/shot-images';

/** A 1 × 1 PNG. */
const PNG_BASE64 = 'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==';

let owner: TestUser;

beforeAll(async () => {
	baseUrl();
	owner = await makeUser('openapi');
});

describe('the published API', () => {
	it('GET /api/v1/openapi.json answers the document', async () => {
		const res = await fetch(`${baseUrl()}/api/v1/openapi.json`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toContain('application/json');
		expect(await res.json()).toEqual(JSON.parse(JSON.stringify(openApiDocument())));
	});

	it('/api shows every route of the document, and loads nothing from another site', async () => {
		const res = await fetch(`${baseUrl()}/api`);
		expect(res.status).toBe(200);
		const html = await res.text();
		for (const route of API_ROUTES) expect(html, route.path).toContain(`>${route.method.toUpperCase()}</span>`);
		for (const path of new Set(API_ROUTES.map((r) => r.path))) expect(html, path).toContain(path);
		expect(html).toContain('document.scene.lights[].guideNumber');
		expect(html).not.toMatch(/(?:src|href)="(?:https?:)?\/\//);
	});

	it('every route answers the status and the fields its row in the table says', async () => {
		const called = new Set<string>();
		const auth = { kind: 'token' as const, who: owner };

		/** Calls a route of the table by its template path, and checks the answer against its row. */
		async function call(method: HttpMethod, template: string, params: Record<string, string | number> = {}, body?: unknown, query = '') {
			const route = API_ROUTES.find((r) => r.method === method && r.path === template);
			if (!route) throw new Error(`${method} ${template} is not in the table`);
			called.add(`${method} ${template}`);
			const path = template.replace(/\{(\w+)\}/g, (_, name: string) => String(params[name]));
			const res = await api(method.toUpperCase(), path + query, { auth, body });
			const what = `${method.toUpperCase()} ${path}`;
			expect(res.status, `${what}: ${JSON.stringify(res.body).slice(0, 300)}`).toBe(route.answer.status);
			if (route.answer.mediaType) expect(res.headers.get('content-type'), what).toBe(route.answer.mediaType);
			if (route.answer.schema) {
				const parsed = route.answer.schema.safeParse(res.body);
				expect(parsed.error?.issues ?? [], what).toEqual([]);
			}
			return res.body;
		}

		await call('post', '/api/v1/calc/flash', {}, { guideNumber: 32, distance: 1, aperture: 16, magnification: 1 });
		await call('post', '/api/v1/calc/flash', {}, { guideNumber: 32, distance: 0.3, magnification: 1, calibrationOffsetStops: -0.3, lowestPower: 1 / 128, narrowestAperture: 32, subjectDepthMm: 18 });
		await call('post', '/api/v1/calc/optics', {}, { aperture: 16, magnification: 1, subjectDepthMm: 10, focalLengthMm: 100 });
		await call('post', '/api/v1/calc/optics', {}, { aperture: 16, magnification: 0.4, magnificationBy: 'close-up-lens', pixelPitchUm: 4, cocBasis: 'pixel' });
		await call('post', '/api/v1/calc/ambient', {}, { ev100: 12, aperture: 16, shutter: 0.01, balanceUnderStops: 1 });
		await call('post', '/api/v1/calc/colour', {}, { fromKelvin: 3200, toKelvin: 5600 });
		await call('post', '/api/v1/exposure', {}, { ...sampleDocument().scene, ambient: { ev100: 8 } });
		await call('post', '/api/v1/exposure', {}, {
			camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0.5, position: [0, -0.4, 0.1] },
			subject: { position: [0, 0, 0], depthMm: 18 },
			lights: [
				{ id: 'box', kind: 'flash', position: [-0.3, 0, 0.2], guideNumber: 24, power: 0.5, emitterWidthM: 0.3, emitterHeightM: 0.3, calibrationOffsetStops: -0.3 },
				{ id: 'silver', kind: 'reflector', position: [0.3, 0, 0], areaM2: 0.01, reflectance: 0.9, surface: 'specular', source: 'box', normal: [-1, 0, 0] }
			]
		});
		await call('get', '/api/v1/health');
		await call('get', '/api/v1/openapi.json');
		await call('get', '/api/dev/mail');
		await call('get', '/api/dev/fail');

		const shelf = await call('post', '/api/v1/gear', {}, { kind: 'flash', name: 'Kestrel 40', spec: { guideNumberM: 40, lowestPower: 1 / 128, syncSpeedS: 1 / 250 } });
		await call('get', '/api/v1/gear');
		await call('get', '/api/v1/gear/{id}', { id: shelf.id });
		await call('patch', '/api/v1/gear/{id}', { id: shelf.id }, { notes: 'New batteries' });

		const { id } = await call('post', '/api/v1/setups', {}, { title: 'Garnet on slate', subject: 'Garnet', document: sampleDocument(), thumbnailPng: PNG_BASE64 });
		await call('get', '/api/v1/setups');
		await call('get', '/api/v1/setups/{id}', { id });
		await call('put', '/api/v1/setups/{id}', { id }, { baseRevision: 1, document: sampleDocument({ notes: 'Card closer' }) });
		await call('get', '/api/v1/setups/{id}/revisions', { id });
		await call('get', '/api/v1/setups/{id}/revisions/{n}', { id, n: 1 });
		await call('post', '/api/v1/setups/{id}/revisions/{n}/restore', { id, n: 1 }, {});
		await call('get', '/api/v1/setups/{id}/revisions/{n}/thumbnail', { id, n: 1 });
		await call('get', '/api/v1/setups/{id}/exposure', { id }, undefined, '?revision=2');
		const file = await call('get', '/api/v1/setups/{id}/export', { id });
		await call('post', '/api/v1/setups/import', {}, file);
		const copy = await call('post', '/api/v1/setups/{id}/duplicate', { id }, { subject: 'Almandine' });
		await call('delete', '/api/v1/setups/{id}', { id: copy.id });
		await call('get', '/api/v1/setups/trash');
		await call('post', '/api/v1/setups/{id}/untrash', { id: copy.id });

		const form = new FormData();
		form.append('files', new Blob([await testImage({ exif: SAMPLE_EXIF })], { type: 'image/jpeg' }), 'garnet-01.jpg');
		const uploaded = await call('post', '/api/v1/setups/{id}/shots', { id }, form);
		const shotId = uploaded.created[0].id;
		await call('get', '/api/v1/setups/{id}/shots', { id });
		await call('get', '/api/v1/setups/{id}/shots/{shotId}', { id, shotId });
		await call('patch', '/api/v1/setups/{id}/shots/{shotId}', { id, shotId }, { typed: { iso: 200 } });
		await call('get', '/api/v1/setups/{id}/shots/{shotId}/image/{variant}', { id, shotId, variant: 'preview' });
		await call('post', '/api/v1/setups/{id}/shots/{shotId}/measure', { id, shotId }, { method: 'region', region: { x: 0.1, y: 0.1, width: 0.5, height: 0.5 } });
		await call('delete', '/api/v1/setups/{id}/shots/{shotId}', { id, shotId });
		await call('post', '/api/v1/setups/{id}/shots/{shotId}/restore', { id, shotId });
		const session = await call('post', '/api/v1/setups/{id}/shots/sessions', { id }, { shotOn: '2026-11-30', note: 'Club evening' });
		const checklist = await call('get', '/api/v1/setups/{id}/shots/checklist', { id });
		await call('patch', '/api/v1/setups/{id}/shots/sessions/{sessionId}', { id, sessionId: session.id }, { ticks: [checklist.items[0]] });
		await call('put', '/api/v1/setups/{id}/shots/checklist', { id }, { items: [...checklist.items, 'Lens cap in the bag'] });
		const calibrated = await call('post', '/api/v1/setups/{id}/shots/calibrate', { id }, { method: 'meter', gearId: shelf.id, aperture: 11, distanceM: 2, iso: 100, power: 0.25 });
		await call('get', '/api/v1/gear/{id}/calibrations', { id: shelf.id });
		await call('post', '/api/v1/gear/{id}/calibrations/{calibrationId}/undo', { id: shelf.id, calibrationId: calibrated.calibration.id });

		expect([...called].sort()).toEqual(API_ROUTES.map((r) => `${r.method} ${r.path}`).sort());
	});
});
