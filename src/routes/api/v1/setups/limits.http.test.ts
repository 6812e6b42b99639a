// The save limits through HTTP against the running app (TEST_BASE_URL): a save carrying the largest
// document and a thumbnail of exactly the limit is accepted and its PNG served back byte for byte;
// one byte more is a 400 naming thumbnailPng, never a 413 from the body limit or adapter-node's.
import { beforeAll, describe, expect, it } from 'vitest';
import { api, baseUrl, expectErrorBody, makeUser, sampleDocument, type TestUser } from '$lib/server/testing/notebook-fixtures';
import { noisePng } from '$lib/server/testing/png';
import { MAX_DOCUMENT_JSON_BYTES, MAX_THUMBNAIL_BYTES, THUMBNAIL_BOX_PX } from '$lib/scene/inputs';

let owner: TestUser;

beforeAll(async () => {
	baseUrl();
	owner = await makeUser('limits');
});

/** The sample document padded (the plan keeps fields it does not know) to exactly `bytes` of JSON. */
function documentOfBytes(bytes: number) {
	const doc = sampleDocument();
	const padding = bytes - JSON.stringify({ ...doc, plan: { padding: '' } }).length;
	const padded = { ...doc, plan: { padding: 'p'.repeat(padding) } };
	expect(JSON.stringify(padded).length).toBe(bytes);
	return padded;
}

async function newSetup() {
	const res = await api('POST', '/api/v1/setups', {
		auth: { kind: 'token', who: owner },
		body: { studioId: owner.personalStudioId, title: 'Limits', subject: 'Pyrite', document: sampleDocument() }
	});
	expect(res.status, JSON.stringify(res.body)).toBe(201);
	return res.body.id as string;
}

function save(id: string, png: Buffer) {
	return api('PUT', `/api/v1/setups/${id}`, {
		auth: { kind: 'token', who: owner },
		body: {
			baseRevision: 1,
			document: documentOfBytes(MAX_DOCUMENT_JSON_BYTES),
			title: 't'.repeat(200),
			message: 'At the limit',
			thumbnailPng: `data:image/png;base64,${png.toString('base64')}`
		}
	});
}

describe('a save at the thumbnail limit', () => {
	it('the largest document with a thumbnail of exactly the limit is saved and the PNG served back whole', async () => {
		const id = await newSetup();
		const png = noisePng(THUMBNAIL_BOX_PX, THUMBNAIL_BOX_PX, { padToBytes: MAX_THUMBNAIL_BYTES });
		const res = await save(id, png);
		expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
		expect(res.body.revisionNumber).toBe(2);
		const served = await fetch(`${baseUrl()}/api/v1/setups/${id}/revisions/2/thumbnail`, { headers: { authorization: `Bearer ${owner.token}` } });
		expect(served.status).toBe(200);
		expect(Buffer.from(await served.arrayBuffer()).equals(png)).toBe(true);
	});

	it('one byte over the limit is a 400 naming thumbnailPng, not a 413, and saves nothing', async () => {
		const id = await newSetup();
		const res = await save(id, noisePng(THUMBNAIL_BOX_PX, THUMBNAIL_BOX_PX, { padToBytes: MAX_THUMBNAIL_BYTES + 1 }));
		expectErrorBody(res, 400, 'thumbnailPng');
		const revisions = await api('GET', `/api/v1/setups/${id}/revisions`, { auth: { kind: 'token', who: owner } });
		expect(revisions.body).toHaveLength(1);
	});
});
