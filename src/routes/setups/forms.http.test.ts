// The notebook's page forms through the running app (TEST_BASE_URL) and its real database: new setup
// (the notebook's small form and the editor's page without JavaScript), import, duplicate and the
// trash's restore. Each action calls the services the JSON routes call; these check that it answers
// as the page shows it: a redirect on success, each message beside its field, 403 and 404 refusals.
import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { setups } from '$lib/server/db/schema';
import { baseUrl, makeStudio, postAction, sampleDocument, type TestStudio } from '$lib/server/testing/notebook-fixtures';
import { createSetup, trashSetup } from '$lib/server/setups';
import { exportSetup } from '$lib/server/setups-export';
import { setupCreateSchema } from '$lib/scene/inputs';

let studio: TestStudio;

beforeAll(async () => {
	baseUrl(); // fails at once when the app is not running
	studio = await makeStudio('Page forms');
});

async function setupRow(id: string) {
	const [row] = await db.select().from(setups).where(eq(setups.id, id));
	return row;
}

async function freshSetup(title = 'Quartz on velvet') {
	const input = setupCreateSchema.parse({ studioId: studio.studioId, title, subject: 'quartz cluster', tags: ['quartz'], document: sampleDocument() });
	const { id } = await createSetup(studio.people.owner.user, input);
	return id;
}

function idFrom(location: string | undefined, query: string): string {
	const match = location?.match(new RegExp(`^/setups/([0-9a-f-]{36})\\?${query}=1$`));
	expect(match, `redirect to a setup page with ?${query}=1, got ${location}`).toBeTruthy();
	return match![1];
}

describe.each([
	['the notebook’s new-setup form', '/setups?/create', 'create'],
	['the editor’s new-setup page without JavaScript', '/setups/new?/create', undefined]
])('%s', (_name, path, action) => {
	it('makes the setup in the chosen studio and goes to its page', async () => {
		const r = await postAction(path, { studioId: studio.studioId, title: 'Ammonite section, raking light', subject: 'ammonite' }, studio.people.editor);
		expect(r.type).toBe('redirect');
		const row = await setupRow(idFrom(r.location, 'created'));
		expect(row).toMatchObject({ studioId: studio.studioId, title: 'Ammonite section, raking light', subject: 'ammonite', latestRevision: 1 });
	});

	it('puts each message beside its field and makes nothing', async () => {
		const cases: [Record<string, string>, string, string | RegExp][] = [
			[{ studioId: studio.studioId, title: '  ', subject: '' }, 'title', 'Give the setup a title.'],
			[{ studioId: studio.studioId, title: 'x'.repeat(201), subject: '' }, 'title', 'must be at most 200 characters'],
			[{ studioId: studio.studioId, title: 'Moss', subject: 's'.repeat(201) }, 'subject', 'must be at most 200 characters'],
			[{ studioId: 'not-a-studio', title: 'Moss', subject: '' }, 'studioId', 'must be a studio id']
		];
		for (const [form, field, message] of cases) {
			const r = await postAction(path, form, studio.people.editor);
			expect(r.type, field).toBe('failure');
			expect(r.status).toBe(400);
			expect(r.data.errors[field]).toMatch(message);
			expect(r.data.action).toBe(action);
			expect(r.data.values.subject).toBe(form.subject);
		}
	});

	it('refuses a viewer (403) and an outsider (404, the studio is not revealed) under the form', async () => {
		const viewer = await postAction(path, { studioId: studio.studioId, title: 'Not mine to add', subject: '' }, studio.people.viewer);
		expect(viewer).toMatchObject({ type: 'failure', status: 403 });
		expect(viewer.data.errors.form).toMatch(/does not allow/);
		const outsider = await postAction(path, { studioId: studio.studioId, title: 'Not mine to add', subject: '' }, studio.people.none);
		expect(outsider).toMatchObject({ type: 'failure', status: 404 });
		expect(outsider.data.errors.form).toBe('No such studio.');
	});
});

describe('importing a setup file on the notebook page', () => {
	async function importFile(text: string, studioId: string, who = studio.people.editor, name = 'quartz.squarelaw.json') {
		const form = new FormData();
		form.set('studioId', studioId);
		form.set('file', new File([text], name, { type: 'application/json' }));
		return postAction('/setups?/import', form, who);
	}

	it('makes a setup from an exported file and goes to it', async () => {
		const { file } = await exportSetup(studio.people.owner.user, await freshSetup('Exported quartz'));
		const r = await importFile(JSON.stringify(file), studio.studioId);
		expect(r.type).toBe('redirect');
		const row = await setupRow(idFrom(r.location, 'imported'));
		expect(row).toMatchObject({ studioId: studio.studioId, title: 'Exported quartz', latestRevision: 1 });
	});

	it('names the problem of a bad file beside the file, with the details, and makes nothing', async () => {
		const { file } = await exportSetup(studio.people.owner.user, await freshSetup());
		const r = await importFile(JSON.stringify({ ...file, title: '' }), studio.studioId, studio.people.editor, 'broken.squarelaw.json');
		expect(r).toMatchObject({ type: 'failure', status: 400 });
		expect(r.data.errors.file).toMatch(/^“broken\.squarelaw\.json”: /);
		expect(r.data.details).toContain('title: must not be empty');
		const notJson = await importFile('{ not json', studio.studioId);
		expect(notJson).toMatchObject({ type: 'failure', status: 400 });
		expect(notJson.data.errors.file).toMatch(/^“quartz\.squarelaw\.json”: /);
	});

	it('puts a bad or forbidden studio beside the studio or the file, as the page shows it', async () => {
		const { file } = await exportSetup(studio.people.owner.user, await freshSetup());
		const bad = await importFile(JSON.stringify(file), 'not-a-studio');
		expect(bad).toMatchObject({ type: 'failure', status: 400 });
		expect(bad.data.errors.studioId).toMatch(/must be a studio id/);
		const viewer = await importFile(JSON.stringify(file), studio.studioId, studio.people.viewer);
		expect(viewer).toMatchObject({ type: 'failure', status: 403 });
		expect(viewer.data.errors.file).toMatch(/does not allow/);
		const outsider = await importFile(JSON.stringify(file), studio.studioId, studio.people.none);
		expect(outsider).toMatchObject({ type: 'failure', status: 404 });
		expect(outsider.data.errors.file).toMatch(/No such studio\./);
	});
});

describe('duplicating a setup for a new subject', () => {
	it('makes the copy, remembers where it came from, and goes to it', async () => {
		const original = await freshSetup('Quartz, one softbox');
		const r = await postAction(`/setups/${original}/duplicate`, { subject: 'smoky quartz', title: 'Smoky quartz, one softbox', studioId: studio.people.viewer.personalStudioId }, studio.people.viewer);
		expect(r.type).toBe('redirect');
		const copy = await setupRow(idFrom(r.location, 'duplicated'));
		expect(copy).toMatchObject({ studioId: studio.people.viewer.personalStudioId, subject: 'smoky quartz', derivedFromSetupId: original, derivedFromRevision: 1 });
	});

	it('puts each message beside its field', async () => {
		const original = await freshSetup();
		const path = `/setups/${original}/duplicate`;
		const empty = await postAction(path, { subject: '', title: '', studioId: '' }, studio.people.editor);
		expect(empty).toMatchObject({ type: 'failure', status: 400 });
		expect(empty.data.errors).toEqual({ subject: 'Name the new subject: the copy is for it.', title: 'Give the copy a title.', studioId: 'Choose the studio the copy goes to.' });
		const long = await postAction(path, { subject: 's'.repeat(201), title: 'Copy', studioId: studio.studioId }, studio.people.editor);
		expect(long.data.errors.subject).toBe('must be at most 200 characters');
		const badStudio = await postAction(path, { subject: 'calcite', title: 'Copy', studioId: 'nope' }, studio.people.editor);
		expect(badStudio.data.errors.studioId).toBe('must be a studio id');
	});

	it('refuses a studio the caller may not add to beside the studio field (403), and an unseen setup with 404', async () => {
		const original = await freshSetup();
		const viewerHere = await postAction(`/setups/${original}/duplicate`, { subject: 'calcite', title: 'Copy', studioId: studio.studioId }, studio.people.viewer);
		expect(viewerHere).toMatchObject({ type: 'failure', status: 403 });
		expect(viewerHere.data.errors.studioId).toMatch(/^You cannot add setups to that studio \(Your role/);
		const elsewhere = await postAction(`/setups/${original}/duplicate`, { subject: 'calcite', title: 'Copy', studioId: studio.people.owner.personalStudioId }, studio.people.editor);
		expect(elsewhere).toMatchObject({ type: 'failure', status: 403 });
		expect(elsewhere.data.errors.studioId).toBe('You cannot add setups to that studio (No such studio.)');
		const outsider = await postAction(`/setups/${original}/duplicate`, { subject: 'calcite', title: 'Copy', studioId: studio.people.none.personalStudioId }, studio.people.none);
		expect(outsider).toMatchObject({ type: 'error', status: 404 });
		expect(outsider.error?.message).toBe('No such setup.');
	});

	it('shows the page to a member and 404 to an outsider', async () => {
		const original = await freshSetup('Fossil fern, window light');
		const page = (cookie: string) => fetch(`${baseUrl()}/setups/${original}/duplicate`, { headers: { cookie }, redirect: 'manual' });
		const viewer = await page(studio.people.viewer.cookie);
		expect(viewer.status).toBe(200);
		expect(await viewer.text()).toContain('Fossil fern, window light');
		expect((await page(studio.people.none.cookie)).status).toBe(404);
	});
});

describe('restoring from the trash', () => {
	it('lists the trashed setup and puts it back with its revisions', async () => {
		const id = await freshSetup('Moss on the sill');
		await trashSetup(studio.people.owner.user, id);
		const page = await fetch(`${baseUrl()}/setups/trash`, { headers: { cookie: studio.people.editor.cookie } });
		expect(await page.text()).toContain('Moss on the sill');
		const r = await postAction('/setups/trash?/restore', { id, title: 'Moss on the sill' }, studio.people.editor);
		expect(r).toMatchObject({ type: 'success', status: 200 });
		expect(r.data.restored).toEqual({ id, title: 'Moss on the sill', revisionNumber: 1 });
		expect((await setupRow(id)).deletedAt).toBeNull();
	});

	it('says why a setup could not be restored: not in the trash (400), a viewer (403), unseen (404)', async () => {
		const id = await freshSetup('Still in the notebook');
		const notTrashed = await postAction('/setups/trash?/restore', { id, title: 'Still in the notebook' }, studio.people.editor);
		expect(notTrashed).toMatchObject({ type: 'failure', status: 400 });
		expect(notTrashed.data.errors.form).toBe('“Still in the notebook” could not be restored: This setup is not in the trash.');
		await trashSetup(studio.people.owner.user, id);
		const viewer = await postAction('/setups/trash?/restore', { id, title: 'Still in the notebook' }, studio.people.viewer);
		expect(viewer).toMatchObject({ type: 'failure', status: 403 });
		const outsider = await postAction('/setups/trash?/restore', { id, title: 'Still in the notebook' }, studio.people.none);
		expect(outsider).toMatchObject({ type: 'failure', status: 404 });
		expect(outsider.data.errors.form).toMatch(/No such setup\./);
		expect((await setupRow(id)).deletedAt).not.toBeNull();
	});
});
