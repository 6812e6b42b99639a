// The notebook in a real browser against the real setups API and database: the seeded setups, the
// aperture table, duplicating for a new subject, notes saved as revisions (and a stale save that loses
// nothing), history and the comparison in words, import and export, the trash, the gear shelf, a
// viewer without edit controls, and the notebook at phone width in dark mode.
import { randomUUID } from 'node:crypto';
import { expect, signedInAs, test } from './fixtures';
import type { Page } from '@playwright/test';
import { inspectorTab } from './workspace';

const OWNER = 'mara.quill@fernhill.example';
const VIEWER = 'ines.marlow@fernhill.example';
const QUARTZ = 'Quartz cluster on black velvet';
const tag = () => randomUUID().slice(0, 8);

/** Opens a page and waits until its scripts have loaded, so a click is never undone by hydration. */
async function visit(page: Page, url: string) {
	await page.goto(url);
	await page.waitForLoadState('networkidle');
}

async function openSetup(page: Page, title: string) {
	// Searched for, so setups other tests made do not push it off the list's first page.
	await visit(page, `/setups?q=${encodeURIComponent(title)}`);
	await page.getByRole('link', { name: title, exact: true }).click();
	await expect(page.getByRole('heading', { level: 1, name: title })).toBeVisible();
	return new URL(page.url()).pathname.split('/')[2];
}

interface ApiRow {
	label: string;
	workingAperture: number;
	exposureOffsetStops: number | null;
	dofMm: number | null;
	airyDiskUm: number;
	diffractionLimited: boolean;
}

test('open a seeded setup, read its aperture table, duplicate it for a new subject, change its notes, and compare the two revisions', async ({
	page,
	context,
	browser,
	baseURL
}) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const quartzId = await openSetup(page, QUARTZ);

	// The aperture table (the editor inspector's Exposure tab): the set aperture is marked, and each figure is the server's.
	await inspectorTab(page, 'Exposure');
	const table = page.getByTestId('aperture-table');
	const chosen = table.locator('tr[aria-current="true"]');
	await expect(chosen).toHaveCount(1);
	await expect(chosen.getByRole('rowheader')).toHaveText(/^f\/16\s*set$/);
	const setup = await (await page.request.get(`/api/v1/setups/${quartzId}`)).json();
	const exposure = await (await page.request.get(`/api/v1/setups/${quartzId}/exposure`)).json();
	const cam = setup.document.scene.camera;
	const row16 = (exposure.apertureTable as ApiRow[]).find((r) => r.label === 'f/16')!;
	const cells = chosen.getByRole('cell');
	// Working aperture N × (1 + m/P) and close-up depth of field 2·N·c·(1 + m/P)/m² (/api/v1/openapi.json, calc/optics;
	// the close-up approximation of any macro handbook, e.g. Lefkowitz, The Manual of Close-Up Photography).
	const wa = 16 * (1 + cam.magnification / (cam.pupilMagnification ?? 1));
	const dof = (2 * 16 * (cam.cocMm ?? 0.03) * (1 + cam.magnification / (cam.pupilMagnification ?? 1))) / cam.magnification ** 2;
	expect(row16.workingAperture).toBeCloseTo(wa, 9);
	await expect(cells.nth(0)).toHaveText(`f/${Math.round(wa * 10) / 10}`);
	const stops = Math.round(row16.exposureOffsetStops! * 10) / 10;
	await expect(cells.nth(1)).toHaveText(stops === 0 ? '0' : `${stops > 0 ? '+' : '−'}${Math.abs(stops).toFixed(1)}`);
	expect(row16.dofMm).toBeCloseTo(dof, 9);
	await expect(cells.nth(2)).toHaveText(`${Number(dof.toPrecision(3))} mm`);
	// Airy disk 2.44·λ·N_w at 550 nm (/api/v1/openapi.json): larger than the 30 µm circle of confusion, so it softens.
	expect(row16.airyDiskUm).toBeCloseTo(2.44 * 0.55 * wa, 6);
	await expect(chosen).toContainText('softens detail');
	await expect(page.getByTestId('exposure-summary')).toContainText('Key light');

	// Duplicate for a new subject.
	const subject = `Smoky quartz point FGC-0131 ${tag()}`;
	const title = `Smoky quartz on black velvet ${tag()}`;
	await page.getByRole('link', { name: 'Duplicate for a new subject' }).click();
	await page.getByLabel('New subject').fill(subject);
	await page.getByLabel('Title of the copy').fill(title);
	await expect(page.getByLabel('Studio')).toHaveValue(setup.studioId);
	await page.getByRole('button', { name: 'Duplicate and open the copy' }).click();
	await expect(page.getByRole('heading', { level: 1, name: title })).toBeVisible();
	await expect(page.getByText(subject, { exact: true })).toBeVisible();
	await expect(page.getByTestId('lineage')).toContainText(`Duplicated from “${QUARTZ}”, revision ${setup.revisionNumber}.`);
	const copyId = new URL(page.url()).pathname.split('/')[2];
	expect(copyId).not.toBe(quartzId);

	// Change its notes and save: a new revision.
	await page.getByText('Edit notes').click();
	const notes = page.getByLabel(/^Notes \(Markdown/);
	const before = await notes.inputValue();
	expect(before).toContain('Quartz cluster for the catalogue');
	await notes.fill(`${before}\n- Smoky quartz: card 5 cm closer, the dark crystal drinks light.`);
	await page.getByLabel('What changed (optional, shown in the history)').fill('Card closer for the smoky quartz');
	await page.getByRole('button', { name: 'Save notes' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Saved as revision 2.' })).toBeVisible();
	await expect(page.getByTestId('notes-rendered')).toContainText('the dark crystal drinks light');

	// The history shows two revisions.
	await page.getByRole('link', { name: 'History', exact: true }).click();
	const revisions = page.getByTestId('revision-timeline').locator(':scope > li');
	await expect(revisions).toHaveCount(2);
	await expect(revisions.nth(0)).toContainText('Card closer for the smoky quartz');
	await expect(revisions.nth(0)).toContainText('Mara Quill');
	await expect(revisions.nth(1)).toContainText(`Duplicated from “${QUARTZ}”`);

	// The notes form saves no picture of the plan, and the timeline says so.
	await expect(revisions.nth(0).getByTestId('no-plan-picture')).toHaveText('No picture of the plan was saved with revision 2.');

	// And the comparison between them, in words, from the newest revision's "compare with" (the one before it by default).
	await expect(revisions.nth(0).getByLabel('Compare revision 2 with', { exact: true })).toHaveValue('1');
	await page.getByRole('button', { name: 'Compare revision 2 with the chosen revision' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Revision 1 → revision 2' })).toBeVisible();
	const words = page.getByTestId('comparison');
	await expect(words).toContainText('Notes changed (1 line added)');
	await expect(page.getByTestId('exposure-change')).toHaveText('0 stops');
	await expect(page.getByTestId('notes-diff')).toContainText('Smoky quartz: card 5 cm closer');
	// Both plans side by side; neither revision was saved from the editor, so neither has a picture, and the page says so.
	const sides = page.getByTestId('plans-side-by-side');
	await expect(sides.getByRole('heading', { level: 2 })).toHaveText(['Before: revision 1', 'After: revision 2']);
	await expect(sides.getByTestId('no-plan-picture')).toHaveText([
		'No picture of the plan was saved with revision 1.',
		'No picture of the plan was saved with revision 2.'
	]);

	// The original lists its new derivative.
	await visit(page, `/setups/${quartzId}`);
	await expect(page.getByTestId('lineage').getByRole('link', { name: `“${title}”` })).toBeVisible();
});

test('a save on a stale revision shows what changed since and keeps what was typed; saving again goes on top', async ({
	page,
	context,
	browser,
	baseURL
}) => {
	await signedInAs(context, browser, baseURL, OWNER);
	// A new setup from the notebook's small form.
	const title = `Pyrite cube test ${tag()}`;
	await visit(page, '/setups');
	await page.getByText('New setup', { exact: true }).click();
	await page.getByLabel('Title').fill(title);
	await page.getByLabel('Subject').first().fill('Pyrite cube');
	await page.getByRole('button', { name: 'Make the setup' }).click();
	await expect(page.getByRole('heading', { level: 1, name: title })).toBeVisible();
	await inspectorTab(page, 'Exposure');
	await expect(page.getByTestId('exposure-summary')).toContainText('No light reaches the subject');
	const id = new URL(page.url()).pathname.split('/')[2];

	await page.getByText('Write notes').click();
	await page.getByLabel(/^Notes \(Markdown/).fill('Mine: pyrite on grey card.');

	// Meanwhile someone else saves revision 2 through the API.
	const current = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	// Saved with a picture of the plan (a 1 × 1 PNG stands in for the editor's), which the history then shows.
	const put = await page.request.put(`/api/v1/setups/${id}`, {
		data: {
			baseRevision: 1,
			document: { ...current.document, notes: 'Theirs: use the silver card.' },
			message: 'Silver card',
			thumbnailPng: 'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII='
		}
	});
	expect(put.status()).toBe(200);

	await page.getByRole('button', { name: 'Save notes' }).click();
	const conflict = page.getByTestId('save-conflict');
	await expect(conflict).toContainText('You started from revision 1; revision 2 is now the latest');
	await expect(conflict).toContainText('Silver card');
	await expect(conflict).toContainText('Theirs: use the silver card.');
	await expect(page.getByLabel(/^Notes \(Markdown/)).toHaveValue('Mine: pyrite on grey card.');

	await page.getByRole('button', { name: 'Save my notes on top of revision 2' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Saved as revision 3.' })).toBeVisible();
	await expect(page.getByTestId('notes-rendered')).toHaveText('Mine: pyrite on grey card.');
	const revisions = await (await page.request.get(`/api/v1/setups/${id}/revisions`)).json();
	expect(revisions.map((r: { number: number }) => r.number)).toEqual([3, 2, 1]);

	// Delete to the trash and restore it, every revision kept.
	await page.getByText('Delete…').click();
	await page.getByRole('button', { name: 'Move to the trash' }).click();
	await expect(page.getByRole('status').filter({ hasText: `“${title}” is in the trash` })).toBeVisible();
	await expect(page.getByRole('link', { name: title, exact: true })).toHaveCount(0);
	await visit(page, '/setups/trash');
	await page.getByRole('button', { name: `Restore ${title}` }).click();
	await expect(page.getByRole('status')).toContainText(`“${title}” is back in the notebook at revision 3.`);
	await visit(page, `/setups/${id}/history`);
	await expect(page.getByTestId('revision-timeline').locator(':scope > li')).toHaveCount(3);
	const pictured = page.getByTestId('revision-timeline').locator('li[data-revision="2"]').getByRole('img', { name: 'The plan of revision 2' });
	await pictured.scrollIntoViewIfNeeded();
	await expect.poll(() => pictured.evaluate((img: HTMLImageElement) => (img.complete ? img.naturalWidth : 0))).toBe(1);
	await expect(page.getByTestId('revision-timeline').locator('li[data-revision="3"]').getByTestId('no-plan-picture')).toBeVisible();

	// Restoring revision 2 makes revision 4, a copy of it; nothing is overwritten.
	await page.getByRole('button', { name: 'Restore revision 2' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Revision 2 restored as revision 4.' })).toBeVisible();
	const rows = page.getByTestId('revision-timeline').locator(':scope > li');
	await expect(rows).toHaveCount(4);
	await expect(rows.nth(0)).toContainText('A copy of revision 2, restored.');
	await page.getByRole('link', { name: 'Open the setup' }).click();
	await expect(page.getByTestId('notes-rendered')).toHaveText('Theirs: use the silver card.');
});

test('export a setup file and import it again; a malformed or foreign file is refused, naming the problem, and creates nothing', async ({
	page,
	context,
	browser,
	baseURL
}) => {
	await signedInAs(context, browser, baseURL, OWNER);
	await openSetup(page, 'Dew-covered moss on the window sill');
	const downloading = page.waitForEvent('download');
	await page.getByRole('link', { name: 'Export JSON' }).click();
	const download = await downloading;
	expect(download.suggestedFilename()).toMatch(/\.squarelaw\.json$/);
	const text = await (await download.createReadStream()).toArray().then((chunks) => Buffer.concat(chunks).toString('utf8'));
	const file = JSON.parse(text);
	expect(file.formatVersion).toBe(1);
	expect(file.title).toBe('Dew-covered moss on the window sill');

	const countBefore = (await (await page.request.get('/api/v1/setups?pageSize=1')).json()).total;
	await visit(page, '/setups');
	await page.getByText('Import a setup file').click();
	const upload = (name: string, body: string) =>
		page.getByLabel(/^Setup file/).setInputFiles({ name, mimeType: 'application/json', buffer: Buffer.from(body) });

	await upload('moss.squarelaw.json', text.slice(0, Math.floor(text.length / 2)));
	await page.getByRole('button', { name: 'Import', exact: true }).click();
	await expect(page.getByRole('alert')).toContainText('truncated');
	await expect(page.getByRole('alert')).toContainText('Nothing was imported.');

	await upload('notes.json', JSON.stringify({ kind: 'shopping-list', items: ['velvet'] }));
	await page.getByRole('button', { name: 'Import', exact: true }).click();
	await expect(page.getByRole('alert')).toContainText('not a Squarelaw setup file');

	const broken = { ...file, document: { ...file.document, scene: { ...file.document.scene, camera: { ...file.document.scene.camera, iso: -100 } } } };
	await upload('broken.squarelaw.json', JSON.stringify(broken));
	await page.getByRole('button', { name: 'Import', exact: true }).click();
	await expect(page.getByRole('alert')).toContainText('document.scene.camera.iso');
	expect((await (await page.request.get('/api/v1/setups?pageSize=1')).json()).total).toBe(countBefore);

	await upload('moss.squarelaw.json', text);
	await page.getByRole('button', { name: 'Import', exact: true }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Imported as a new setup: revision 1.' })).toBeVisible();
	await expect(page.getByRole('heading', { level: 1, name: 'Dew-covered moss on the window sill' })).toBeVisible();
	expect((await (await page.request.get('/api/v1/setups?pageSize=1')).json()).total).toBe(countBefore + 1);
});

test('the gear shelf names the field at fault, adds, edits and retires gear', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	await visit(page, '/gear');
	await expect(page.getByLabel('Studio', { exact: true })).toHaveValue(/.+/);
	await expect(page.getByTestId('gear-flash')).toContainText('Kestrel 40 speedlight');

	const name = `Gold card ${tag()}`;
	const section = page.locator('#reflector');
	await section.getByText('Add a reflector').click();
	await section.getByLabel('Name').fill(name);
	await section.getByLabel('Width').fill('25');
	await section.getByLabel('Height').fill('wide');
	await section.getByLabel('Reflectance').fill('150 %');
	await section.getByRole('button', { name: 'Add to the shelf' }).click();
	// Our form reads the size; the API's own check refuses the reflectance, named beside the field.
	await expect(section.locator('#add-reflector-heightM-error')).toContainText('Height');
	await section.getByLabel('Height').fill('20 cm');
	await section.getByRole('button', { name: 'Add to the shelf' }).click();
	await expect(section.locator('#add-reflector-reflectance-error')).toHaveText('Reflectance must be at most 1');
	await expect(section.getByLabel('Name')).toHaveValue(name);
	await section.getByLabel('Reflectance').fill('90 %');
	await section.getByRole('button', { name: 'Add to the shelf' }).click();
	await expect(page.getByRole('status').filter({ hasText: `“${name}” is on the shelf.` })).toBeVisible();
	const row = page.getByTestId('gear-reflector').getByRole('row').filter({ hasText: name });
	await expect(row).toContainText('25 cm');
	await expect(row).toContainText('90 %');

	await row.getByRole('link', { name: `Edit ${name}` }).click();
	await page.locator('#edit-reflectance').fill('0.8');
	await page.getByRole('button', { name: 'Save changes' }).click();
	await expect(page.getByRole('status').filter({ hasText: `Saved “${name}”.` })).toBeVisible();
	await expect(page.getByTestId('gear-reflector').getByRole('row').filter({ hasText: name })).toContainText('80 %');

	await page.getByTestId('gear-reflector').getByRole('button', { name: `Retire ${name}` }).click();
	await expect(page.getByRole('status').filter({ hasText: `“${name}” is retired` })).toBeVisible();
	await expect(page.getByTestId('gear-reflector')).not.toContainText(name);
	await expect(page.getByRole('button', { name: `Put ${name} back on the shelf` })).toBeVisible();
});

test('a viewer reads a setup without edit controls and can only duplicate it into a studio of their own', async ({
	page,
	context,
	browser,
	baseURL
}) => {
	await signedInAs(context, browser, baseURL, VIEWER);
	await openSetup(page, QUARTZ);
	await expect(page.getByTestId('aperture-table')).toBeVisible();
	await expect(page.getByText('Edit notes')).toHaveCount(0);
	await expect(page.getByText('Change settings')).toHaveCount(0);
	await expect(page.getByText('Delete…')).toHaveCount(0);
	await expect(page.getByText('Edit title, subject and tags')).toHaveCount(0);
	await expect(page.getByText(/your role in Fernhill Geology Circle does not let you change it/)).toBeVisible();
	await page.getByRole('link', { name: 'Duplicate for a new subject' }).click();
	const studios = page.getByLabel('Studio').locator('option');
	await expect(studios).toHaveCount(1);
	await expect(studios).toHaveText(/\(personal\)$/);
});

test('the notebook at phone width in dark mode: no sideways scroll, search as you type', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	await page.setViewportSize({ width: 390, height: 844 });
	await page.addInitScript(() => {
		try {
			localStorage.setItem('squarelaw-theme', 'dark');
		} catch {
			/* about:blank has no storage */
		}
	});
	await visit(page, '/setups');
	await expect(page.locator('html')).toHaveClass(/\bdark\b/);
	const background = await page.evaluate(() => getComputedStyle(document.documentElement).backgroundColor);
	const [r, g, b] = background.match(/\d+/g)!.map(Number);
	expect(r + g + b).toBeLessThan(120);
	await expect(page.getByTestId('setup-table')).toBeVisible();
	expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);

	await page.getByLabel('Search', { exact: true }).pressSequentially('ammonite', { delay: 30 });
	await expect(page.getByTestId('setup-table').locator('tbody tr')).toHaveCount(1);
	await expect(page.getByTestId('setup-table')).toContainText('Ammonite section, raking light from the left');
	await expect(page).toHaveURL(/\/setups\?q=ammonite$/);
	await page.getByLabel('Search', { exact: true }).fill('no such mineral anywhere');
	await expect(page.getByRole('heading', { name: 'No setups match' })).toBeVisible();
	expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);

	// The setup page fits the phone too.
	await visit(page, `/setups?q=${encodeURIComponent(QUARTZ)}`);
	await page.getByRole('link', { name: QUARTZ }).click();
	await inspectorTab(page, 'Exposure');
	await expect(page.getByTestId('aperture-table')).toBeVisible();
	expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
});
