// The plan editor's journeys, end to end in Chromium against the real API and database: a tabletop plan
// sketched on a new setup (subject, camera, a flash in a softbox, a white card), f/16 at 1:1 and the flash
// power the panel asks for; the flash dragged twice as far (two stops less, by the inverse-square law);
// undo; save with a thumbnail; reload; duplicate for a new subject and open the copy; print the setup
// sheet to a PDF and read its text. Then the page without JavaScript.
import { randomUUID } from 'node:crypto';
import type { Locator, Page } from '@playwright/test';
import { extractText, getDocumentProxy } from 'unpdf';
import { expect, signedInAs, test } from './fixtures';
import { inspectorTab } from './workspace';

const OWNER = 'mara.quill@fernhill.example';
const AMMONITE = 'Ammonite section, raking light from the left';

type Vec3 = [number, number, number];
interface SceneLight {
	id: string;
	kind: string;
	position: Vec3;
	guideNumber?: number;
	power?: number;
	lossStops?: number;
	source?: string;
}
interface Scene {
	camera: { iso: number; aperture: number; magnification: number; pupilMagnification?: number };
	subject: { position: Vec3 };
	lights: SceneLight[];
}

/** The editor's unsaved document as this browser keeps it (the local draft), once it is written. */
async function draftScene(page: Page, key: string, expectText?: string): Promise<Scene> {
	const storageKey = `squarelaw:plan-draft:${key}`;
	if (expectText) await expect.poll(() => page.evaluate((k) => localStorage.getItem(k), storageKey)).toContain(expectText);
	const raw = await page.evaluate((k) => localStorage.getItem(k), storageKey);
	expect(raw, 'the local draft').toBeTruthy();
	return JSON.parse(raw!).document.scene as Scene;
}

async function waitLive(page: Page) {
	await page.waitForLoadState('networkidle');
	await expect(page.getByTestId('plan-canvas').locator('canvas').first()).toBeVisible();
}

/** The exposure panel (the inspector's Exposure tab) shows an answer (the browser computes it with every change). */
async function upToDate(page: Page) {
	await inspectorTab(page, 'Exposure');
	await expect(page.getByTestId('exposure-panel').getByTestId('exposure-summary')).toBeVisible();
}

/** A light's contribution at the subject in stops, as the exposure panel has it (its row's exact value). */
async function stopsOf(page: Page, label: string): Promise<number> {
	await upToDate(page);
	const row = page.getByTestId('exposure-panel').getByTestId('exposure-summary').getByRole('row').filter({ has: page.getByRole('rowheader', { name: new RegExp(`^${label}`) }) });
	const cell = row.locator('[data-light-stops]');
	const value = Number(await cell.getAttribute('data-light-stops'));
	// What the row shows agrees with the exact value it carries.
	const shown = (await cell.textContent())!.trim();
	const r = Math.round(value * 10) / 10;
	expect(shown).toBe(r === 0 ? '0 stops' : `${r > 0 ? '+' : '−'}${Math.abs(r)} ${Math.abs(r) === 1 ? 'stop' : 'stops'}`);
	return value;
}

/** Where an element is on the plan, in metres, read from its button in the element list. */
async function listedAt(list: Locator, label: string): Promise<[number, number]> {
	await inspectorTab(list.page(), 'Element');
	const name = (await list.getByRole('button', { name: new RegExp(`^${label}, `) }).textContent())!;
	const m = name.match(/at (-?[\d.]+) cm, (-?[\d.]+) cm/);
	expect(m, `position in "${name}"`).toBeTruthy();
	return [Number(m![1]) / 100, Number(m![2]) / 100];
}

/** Places an element from the palette with a click on the plan (Alt: no snapping to the grid). */
async function placeAt(page: Page, kindButton: string, screen: { x: number; y: number }) {
	await page.getByRole('toolbar', { name: 'Plan tools' }).getByRole('button', { name: kindButton, exact: true }).click();
	await page.keyboard.down('Alt');
	await page.mouse.click(screen.x, screen.y);
	await page.keyboard.up('Alt');
}

async function setField(page: Page, label: string, value: string) {
	const field = page.getByLabel(label, { exact: true });
	await field.fill(value);
	await field.press('Enter');
	await field.blur();
}

const dist = (a: readonly number[], b: readonly number[]) => Math.hypot(...a.map((v, i) => v - b[i]));

test('sketch a tabletop plan on a new setup, f/16 at 1:1, twice as far is two stops less, undo, save, reload, duplicate, print the sheet', async ({
	page,
	context,
	browser,
	baseURL
}) => {
	test.setTimeout(180_000);
	await signedInAs(context, browser, baseURL, OWNER);
	const title = `Calcite rhomb, one softbox ${randomUUID().slice(0, 8)}`;

	// From the notebook's "New setup" form into the editor on an empty plan, the fields carried over.
	await page.goto('/setups');
	await page.getByText('New setup', { exact: true }).click();
	await page.getByLabel('Title').fill(title);
	await page.getByLabel('Subject').first().fill('Calcite rhomb (FGC-0202)');
	await page.getByRole('button', { name: 'Draw the plan first' }).click();
	await expect(page).toHaveURL(/\/setups\/new\?/);
	await waitLive(page);
	await expect(page.locator('#new-title')).toHaveValue(title);
	await expect(page.locator('#new-subject')).toHaveValue('Calcite rhomb (FGC-0202)');
	const list = page.getByTestId('element-list');
	// The empty setup has its subject and camera, and nothing else.
	await expect(list.getByRole('listitem')).toHaveCount(2);
	await expect(list.getByRole('button', { name: /^Subject, Subject, at / })).toBeVisible();
	await expect(list.getByRole('button', { name: /^Camera, Camera, at / })).toBeVisible();

	// A white card and a flash, each placed with a click on the plan; the two clicks and where the list
	// says the elements landed give the plan's scale and offset on screen, for the drag later on.
	const box = (await page.getByTestId('plan-canvas').boundingBox())!;
	const cardScreen = { x: box.x + box.width * 0.72, y: box.y + box.height * 0.3 };
	const flashScreen = { x: box.x + box.width * 0.3, y: box.y + box.height * 0.3 };
	await placeAt(page, 'Reflector', cardScreen);
	await expect(list.getByRole('listitem')).toHaveCount(3);
	await setField(page, 'Label', 'White card');
	await placeAt(page, 'Flash', flashScreen);
	await expect(list.getByRole('listitem')).toHaveCount(4);
	const cardPlan = await listedAt(list, 'White card');
	const flashPlan = await listedAt(list, 'Flash');
	const zoom = Math.hypot(cardScreen.x - flashScreen.x, cardScreen.y - flashScreen.y) / dist(cardPlan, flashPlan);
	// Relative to the canvas's box, which moves on screen as the page scrolls.
	const flashInBox = { x: flashScreen.x - box.x, y: flashScreen.y - box.y };
	const toCanvas = (p: readonly number[]) => ({ x: flashInBox.x + (p[0] - flashPlan[0]) * zoom, y: flashInBox.y + (p[1] - flashPlan[1]) * zoom });

	// The flash goes in a small softbox, at the subject's height, aimed at it; the card bounces it.
	await page.getByLabel('Modifier on Flash').selectOption({ label: 'Small softbox (30 cm) (−1.5 stops)' });
	let scene = await draftScene(page, 'new', '"lossStops":1.5');
	const subjectZ = scene.subject.position[2];
	await setField(page, 'Height above the table', `${(subjectZ * 100).toFixed(1)} cm`);
	// Lengths are parsed with units (loaded on first use): aim once the new height is in.
	await expect
		.poll(async () => Math.abs((await draftScene(page, 'new')).lights.find((l) => l.kind === 'flash')!.position[2] - subjectZ))
		.toBeLessThan(0.001);
	await page.getByRole('button', { name: 'Aim at the subject' }).click();
	// Its front taken as a point, so the flash question's point law is the check below (nearer than five
	// times its size a softbox is otherwise a sized source, and the inverse-square law no longer holds).
	await page.getByLabel('Its front', { exact: true }).selectOption('point');
	await list.getByRole('button', { name: /^White card, / }).click();
	await page.getByLabel('White card bounces').selectOption({ label: 'Flash' });
	await page.getByRole('button', { name: 'Aim at the subject' }).click();

	// The rhomb's face turned to the flash (a direction on the plan), so the flash meets it face on: the
	// plan's camera stands in front and the flash behind the subject, so a face toward the camera would
	// get none of it (Lambert's cosine law).
	{
		const now = await draftScene(page, 'new');
		const f = now.lights.find((l) => l.kind === 'flash')!.position;
		const towardFlashDeg = (Math.atan2(f[1] - now.subject.position[1], f[0] - now.subject.position[0]) * 180) / Math.PI;
		await list.getByRole('button', { name: /^Subject, / }).click();
		await page.getByLabel('Its face looks', { exact: true }).selectOption('direction');
		await setField(page, 'Face turned toward (°, clockwise from right)', String(Math.round(towardFlashDeg)));
		await draftScene(page, 'new', '"normal"');
	}

	// f/16 at 1:1.
	await inspectorTab(page, 'Camera');
	await setField(page, 'Aperture (f-number, marked)', '16');
	await setField(page, 'Magnification', '1:1');
	const panel = page.getByTestId('exposure-panel');
	await upToDate(page);
	await expect(panel.locator('tr[aria-current="true"]').getByRole('rowheader')).toHaveText(/^f\/16\s*set$/);

	// The flash power the panel says is needed, against the flash calculation route with the same flash.
	scene = await draftScene(page, 'new', '"magnification":1');
	const flash = scene.lights.find((l) => l.kind === 'flash')!;
	expect(flash.lossStops).toBeCloseTo(1.5, 9);
	expect(flash.position[2]).toBeCloseTo(subjectZ, 3);
	expect(scene.lights.find((l) => l.kind === 'reflector')!.source).toBe(flash.id);
	const d1 = dist(flash.position, scene.subject.position);
	const calc = await page.request.post('/api/v1/calc/flash', {
		data: { guideNumber: flash.guideNumber, distance: d1, iso: scene.camera.iso, power: flash.power, lossStops: flash.lossStops, magnification: 1, aperture: 16 }
	});
	expect(calc.status()).toBe(200);
	const needed = await calc.json();
	const powerLine = panel.getByTestId('flash-power').locator(`li[data-flash="${flash.id}"]`);
	await expect(powerLine.getByTestId('flash-power-step')).toHaveText(needed.nearestPowerStep.label);
	const exactShown = Number((await powerLine.textContent())!.match(/exactly ([\d.e+-]+) of full/)![1]);
	expect(Math.abs(exactShown - needed.requiredPower) / needed.requiredPower).toBeLessThan(0.01);

	// Drag the flash twice as far from the subject, along the line from the subject (Alt: no snapping).
	const before = await stopsOf(page, 'Flash');
	const s = scene.subject.position;
	const reach = Math.sqrt(4 * d1 * d1 - (flash.position[2] - s[2]) ** 2);
	const along = Math.hypot(flash.position[0] - s[0], flash.position[1] - s[1]);
	const target = [s[0] + ((flash.position[0] - s[0]) * reach) / along, s[1] + ((flash.position[1] - s[1]) * reach) / along];
	await page.getByTestId('plan-canvas').scrollIntoViewIfNeeded();
	const now = (await page.getByTestId('plan-canvas').boundingBox())!;
	// Grab it 5 cm behind its front (inside the softbox as drawn), and move that point by the same amount.
	const ux = (flash.position[0] - s[0]) / along;
	const uy = (flash.position[1] - s[1]) / along;
	const fromIn = toCanvas([flash.position[0] + 0.05 * ux, flash.position[1] + 0.05 * uy]);
	const toIn = toCanvas([target[0] + 0.05 * ux, target[1] + 0.05 * uy]);
	for (const q of [fromIn, toIn]) {
		expect(q.x, 'the drag stays on the plan').toBeGreaterThan(0);
		expect(q.x).toBeLessThan(now.width);
		expect(q.y).toBeGreaterThan(0);
		expect(q.y).toBeLessThan(now.height);
	}
	const from = { x: now.x + fromIn.x, y: now.y + fromIn.y };
	const to = { x: now.x + toIn.x, y: now.y + toIn.y };
	await page.mouse.move(from.x, from.y);
	await page.keyboard.down('Alt');
	await page.mouse.down();
	await page.mouse.move(to.x, to.y, { steps: 12 });
	await page.mouse.up();
	await page.keyboard.up('Alt');
	await expect.poll(async () => dist((await draftScene(page, 'new')).lights.find((l) => l.id === flash.id)!.position, s)).toBeGreaterThan(1.5 * d1);
	const d2 = dist((await draftScene(page, 'new')).lights.find((l) => l.id === flash.id)!.position, s);
	expect(d2 / d1).toBeGreaterThan(1.95);
	expect(d2 / d1).toBeLessThan(2.05);
	await expect.poll(() => stopsOf(page, 'Flash')).toBeLessThan(before - 1);
	const after = await stopsOf(page, 'Flash');
	// Inverse-square law: twice the distance, a quarter of the light, two stops (any optics textbook).
	expect(after - before).toBeGreaterThan(-2.1);
	expect(after - before).toBeLessThan(-1.9);

	// Undo puts it back where it was, and its light with it.
	await page.getByRole('button', { name: 'Undo', exact: true }).click();
	await expect.poll(() => stopsOf(page, 'Flash')).toBeCloseTo(before, 2);
	expect(await listedAt(list, 'Flash')).toEqual(flashPlan);

	// The first save makes the setup (with its thumbnail) and goes to its page, which is the editor.
	const namesBefore = await list.getByRole('listitem').getByRole('button', { name: /, at / }).evaluateAll((els) => els.map((e) => e.textContent));
	await page.getByRole('button', { name: 'Make the setup' }).first().click();
	await expect(page).toHaveURL(/\/setups\/[0-9a-f-]{36}\?created=1$/);
	const id = new URL(page.url()).pathname.split('/')[2];
	await waitLive(page);
	await expect(page.getByRole('heading', { level: 1, name: title })).toBeVisible();
	await expect(page.getByTestId('revision-number')).toHaveText('1');
	const saved = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	expect(saved.document.scene.camera).toMatchObject({ aperture: 16, magnification: 1 });
	expect(saved.thumbnailRevision).toBe(1);
	const thumb = await page.request.get(`/api/v1/setups/${id}/revisions/1/thumbnail`);
	expect(thumb.headers()['content-type']).toBe('image/png');
	const png = await thumb.body();
	expect([...png.subarray(1, 4)].map((c) => String.fromCharCode(c)).join('')).toBe('PNG');
	// At most THUMBNAIL_BOX_PX (360) on its longer side (IHDR width and height), so any the editor makes fits the API's limit.
	expect(Math.max(png.readUInt32BE(16), png.readUInt32BE(20))).toBeLessThanOrEqual(360);

	// Reload: the plan is as saved, nothing restored from a draft.
	await page.reload();
	await waitLive(page);
	await expect(page.getByText(/were restored/)).toHaveCount(0);
	const namesAfter = await list.getByRole('listitem').getByRole('button', { name: /, at / }).evaluateAll((els) => els.map((e) => e.textContent));
	expect(namesAfter.sort()).toEqual(namesBefore.sort());
	await inspectorTab(page, 'Exposure');
	await expect(panel.locator('tr[aria-current="true"]').getByRole('rowheader')).toHaveText(/^f\/16\s*set$/);
	expect(await stopsOf(page, 'Flash')).toBeCloseTo(before, 2);

	// A change saved as revision 2 with a message, and the notebook's table shows that revision's thumbnail.
	await inspectorTab(page, 'Element');
	await list.getByRole('button', { name: /^White card, / }).click();
	await page.getByLabel('x (across)').fill(`${(cardPlan[0] * 100 - 5).toFixed(1)} cm`);
	await page.getByLabel('x (across)').press('Enter');
	await inspectorTab(page, 'Save');
	await page.getByLabel('What changed (optional)').fill('Card 5 cm closer');
	await page.getByRole('button', { name: 'Save revision' }).click();
	await expect(page.getByTestId('revision-number')).toHaveText('2');
	await page.goto(`/setups?q=${encodeURIComponent(title)}`);
	const thumbImg = page.getByTestId('setup-table').getByRole('img', { name: `Plan of ${title}` });
	await expect(thumbImg).toHaveAttribute('src', `/api/v1/setups/${id}/revisions/2/thumbnail`);
	await expect.poll(() => thumbImg.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBeGreaterThan(0);

	// Print the setup sheet: one page with the plan, the settings and the aperture table.
	await page.goto(`/setups/${id}`);
	await waitLive(page);
	await upToDate(page);
	const sheet = page.getByTestId('setup-sheet');
	await expect(sheet.locator('img')).toHaveAttribute('src', /^data:image\/png;base64,/);
	const sheetRow = sheet.getByTestId('sheet-aperture-table').locator('tr[aria-current="true"]');
	const wa16 = (await sheetRow.locator('td').first().textContent())!.trim();
	expect(wa16).toBe('f/32'); // working aperture N × (1 + m/P) = 16 × 2 at 1:1 (/api/v1/openapi.json)
	const pdf = await page.pdf({ format: 'A4', printBackground: true });
	const doc = await getDocumentProxy(new Uint8Array(pdf));
	expect(doc.numPages).toBe(1);
	const { text } = await extractText(doc, { mergePages: true });
	const flat = (text as string).replace(/\s+/g, ' ');
	expect(flat).toContain(title);
	expect(flat).toContain('Aperture table');
	for (const label of ['f/2.8', 'f/11', 'f/16', 'f/22', 'f/32']) expect(flat).toContain(label);
	expect(flat).toContain('Camera');
	expect(flat).toContain('Gear');
	expect(flat).toContain("manual, local codes and licensed practice");
	expect(flat).not.toContain('Save revision');

	// Duplicate for a new subject and open the copy: the same plan, in the editor, remembering its origin.
	await page.getByRole('link', { name: 'Duplicate for a new subject' }).click();
	await page.getByLabel('New subject').fill('Calcite rhomb (FGC-0203)');
	await page.getByLabel('Title of the copy').fill(`${title} (copy)`);
	await page.getByRole('button', { name: 'Duplicate and open the copy' }).click();
	await expect(page).toHaveURL(/\/setups\/[0-9a-f-]{36}\?duplicated/);
	const copyId = new URL(page.url()).pathname.split('/')[2];
	expect(copyId).not.toBe(id);
	await waitLive(page);
	await expect(page.getByTestId('lineage')).toContainText('Duplicated from');
	await inspectorTab(page, 'Element');
	await expect(list.getByRole('listitem')).toHaveCount(4);
	await expect(list.getByRole('button', { name: /^White card, / })).toBeVisible();
	expect(await stopsOf(page, 'Flash')).toBeCloseTo(before, 2);
});

test('without JavaScript the setup page shows the saved exposure and aperture table, and the settings form still saves', async ({
	page,
	context,
	browser,
	baseURL
}) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const seeded = ((await (await page.request.get(`/api/v1/setups?q=${encodeURIComponent(AMMONITE)}`)).json()).items as { id: string; title: string }[]).find((s) => s.title === AMMONITE)!;
	const source = await (await page.request.get(`/api/v1/setups/${seeded.id}`)).json();
	const created = await page.request.post('/api/v1/setups', {
		data: { studioId: source.studioId, title: `No-script ${randomUUID().slice(0, 8)}`, subject: 'Polished fossil', document: { ...source.document, notes: '' } }
	});
	expect(created.status()).toBe(201);
	const id = (await created.json()).id as string;

	const noJs = await browser.newContext({ baseURL, javaScriptEnabled: false });
	await noJs.addCookies(await context.cookies());
	const p = await noJs.newPage();
	await p.goto(`/setups/${id}`);
	const exposure = await (await page.request.get(`/api/v1/setups/${id}/exposure`)).json();
	const table = p.getByTestId('exposure-panel').getByTestId('aperture-table');
	await expect(table).toBeVisible();
	await expect(table.locator('tbody tr')).toHaveCount(exposure.apertureTable.length);
	await expect(p.getByTestId('element-list')).toBeVisible();
	// No picture was saved with it: the plan is listed in words where the canvas would be.
	const words = p.getByTestId('plan-canvas').getByTestId('plan-fallback');
	await expect(words).toContainText('(the drawing needs JavaScript)');
	await expect(words.getByRole('listitem').filter({ hasText: 'from the subject' }).first()).toBeVisible();
	await p.getByText('Change settings').click();
	await p.getByLabel('Aperture').fill('f/22');
	await p.getByRole('button', { name: 'Save settings' }).click();
	await expect(p.getByText('Saved as revision 2.')).toBeVisible();
	const saved = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	expect(saved.document.scene.camera.aperture).toBe(22);
	await noJs.close();
});
