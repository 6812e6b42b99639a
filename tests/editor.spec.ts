// The plan editor (the setup page, /setups/<id>) in a real browser against the real API and database: a seeded setup's plan with the
// live exposure panel and its aperture table; the element list used by keyboard alone (add, move by
// typed coordinates, delete); the aperture set to f/16 and the flash power the panel gives, checked
// against the flash calculation route; and a save with a message that makes a new revision.
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import type { Page } from '@playwright/test';
import { nearestPowerStep } from '../src/lib/light/flash';
import { expect, signedInAs, test } from './fixtures';
import { inspectorTab } from './workspace';

const OWNER = 'mara.quill@fernhill.example';
const VIEWER = 'ines.marlow@fernhill.example';
const AMMONITE = 'Ammonite section, raking light from the left';


async function seededId(page: Page, title: string): Promise<string> {
	const res = await page.request.get(`/api/v1/setups?q=${encodeURIComponent(title)}&pageSize=50`);
	expect(res.status()).toBe(200);
	const hit = ((await res.json()).items as { id: string; title: string }[]).find((s) => s.title === title);
	expect(hit, `seeded setup "${title}"`).toBeTruthy();
	return hit!.id;
}

/**
 * A new setup with the seeded one's scene (the editor lays the plan out), its own title and no notes or
 * tags: edits and saves go there, and the notebook's searches for the seeded setups still find one each.
 */
async function freshCopy(page: Page, seededIdValue: string, what: string): Promise<string> {
	const source = await (await page.request.get(`/api/v1/setups/${seededIdValue}`)).json();
	const res = await page.request.post('/api/v1/setups', {
		data: {
			studioId: source.studioId,
			title: `Editor ${what} ${randomUUID().slice(0, 8)}`,
			subject: 'Polished fossil (editor test)',
			document: { schemaVersion: source.document.schemaVersion, scene: source.document.scene, plan: {}, notes: '' }
		}
	});
	expect(res.status()).toBe(201);
	return ((await res.json()) as { id: string }).id;
}

async function openPlan(page: Page, id: string) {
	await page.goto(`/setups/${id}`);
	await page.waitForLoadState('networkidle');
	await expect(page.getByTestId('plan-canvas').locator('canvas').first()).toBeVisible();
	await expect(page.getByTestId('exposure-strip').getByTestId('strip-total')).toBeVisible();
}

test('the plan editor: canvas, live exposure, the element list by keyboard, f/16 and the flash power, save as a revision', async ({
	page,
	context,
	browser,
	baseURL
}) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const seeded = await seededId(page, AMMONITE);

	// The setup page is the editor; the old address of the plan editor leads there (a permanent redirect).
	const old = await page.request.get(`/setups/${seeded}/plan`, { maxRedirects: 0 });
	expect(old.status()).toBe(308);
	expect(old.headers()['location']).toBe(`/setups/${seeded}`);
	await page.goto(`/setups/${seeded}/plan`);
	await expect(page).toHaveURL(new RegExp(`/setups/${seeded}$`));
	await page.waitForLoadState('networkidle');
	await expect(page.getByTestId('plan-canvas').locator('canvas').first()).toBeVisible();
	const panel = page.getByTestId('exposure-panel');
	await inspectorTab(page, 'Exposure');
	await expect(panel.getByTestId('aperture-table')).toBeVisible();
	// The seeded camera is at f/11: that row is marked as set.
	await expect(panel.locator('tr[aria-current="true"]').getByRole('rowheader')).toHaveText(/^f\/11\s*set$/);

	// Edits and saves go to a new setup with the same scene, so the seeded one stays as other tests expect it.
	const id = await freshCopy(page, seeded, 'plan test');
	await openPlan(page, id);
	// The live exposure is worked out in the browser: editing sends the exposure route nothing.
	const exposureRequests: string[] = [];
	page.on('request', (r) => {
		if (new URL(r.url()).pathname === '/api/v1/exposure') exposureRequests.push(r.url());
	});

	// Add, move by typed coordinates and delete with the keyboard alone (focus moves by key presses).
	await inspectorTab(page, 'Element');
	const list = page.getByTestId('element-list');
	const before = await list.getByRole('listitem').count();
	await page.getByLabel('New element').focus();
	await page.keyboard.type('Diffuser');
	await expect(page.getByLabel('New element')).toHaveValue('diffuser');
	await page.keyboard.press('Tab');
	await expect(page.getByRole('button', { name: 'Add element' })).toBeFocused();
	await page.keyboard.press('Enter');
	await expect(list.getByRole('listitem')).toHaveCount(before + 1);
	const diffuser = list.getByRole('button', { name: /^Diffuser, Diffuser, at / });
	await expect(diffuser).toHaveAttribute('aria-pressed', 'true');

	await page.getByLabel('x (across)').focus();
	await page.keyboard.press('Control+A');
	await page.keyboard.type('12 cm');
	await page.keyboard.press('Tab');
	await page.keyboard.press('Control+A');
	await page.keyboard.type('-0.5 ft');
	await page.keyboard.press('Enter');
	// −0.5 ft = −15.24 cm (1 ft = 0.3048 m exactly, by the international yard and pound agreement of 1959).
	await expect(diffuser).toHaveAccessibleName('Diffuser, Diffuser, at 12 cm, -15.2 cm');

	// A length that does not parse is refused beside its field, and the element stays put.
	await page.getByLabel('x (across)').focus();
	await page.keyboard.press('Control+A');
	await page.keyboard.type('twelve');
	await page.keyboard.press('Enter');
	await expect(page.locator('#move-error')).toContainText('x:');
	await expect(diffuser).toHaveAccessibleName('Diffuser, Diffuser, at 12 cm, -15.2 cm');

	await diffuser.focus();
	await page.keyboard.press('Delete');
	await expect(list.getByRole('listitem')).toHaveCount(before);
	await expect(list.getByRole('button', { name: /^Diffuser,/ })).toHaveCount(0);

	// f/16: the panel marks it in the aperture table and says what power the raking flash needs.
	await inspectorTab(page, 'Camera');
	const aperture = page.getByLabel('Aperture (f-number, marked)');
	await aperture.fill('16');
	await aperture.press('Enter');
	await aperture.blur();
	// The strip above the plan follows at once; the full panel is one tab away.
	await expect(page.getByTestId('exposure-strip')).toContainText('At f/16');
	await inspectorTab(page, 'Exposure');
	await expect(panel.locator('tr[aria-current="true"]').getByRole('rowheader')).toHaveText(/^f\/16\s*set$/);
	expect(exposureRequests).toEqual([]);
	// The copy was made from the scene alone, so the editor laid its camera out in front of the subject;
	// an ammonite section lies face up, as the inspector can say.
	await inspectorTab(page, 'Element');
	await page.getByTestId('element-list').getByRole('button', { name: /^Subject, / }).click();
	await page.getByLabel('Its face looks', { exact: true }).selectOption('up');
	await inspectorTab(page, 'Exposure');
	const rakeLine = panel.getByTestId('flash-power').locator('li[data-flash="rake"]');
	const shownStep = (await rakeLine.getByTestId('flash-power-step').textContent())!.trim();

	// The same flash through the flash calculation route: GN / (d · N_w) is the guide-number relation
	// (any flash manual; /api/v1/openapi.json, calc/flash), with the working aperture N × (1 + m/P).
	const setup = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	const scene = setup.document.scene;
	const rake = scene.lights.find((l: { id: string }) => l.id === 'rake');
	const d = Math.hypot(...(rake.position as number[]).map((v: number, i: number) => v - scene.subject.position[i]));
	const calc = await page.request.post('/api/v1/calc/flash', {
		data: {
			guideNumber: rake.guideNumber,
			distance: d,
			iso: scene.camera.iso,
			power: rake.power,
			lossStops: rake.lossStops ?? 0,
			magnification: scene.camera.magnification,
			pupilMagnification: scene.camera.pupilMagnification ?? 1,
			aperture: 16
		}
	});
	expect(calc.status()).toBe(200);
	const flash = await calc.json();
	// The section lies face up (set above), so the rake meets it at a grazing angle: Lambert's cosine law
	// (irradiance ∝ cos of the angle of incidence; Hecht, "Optics", from memory) asks for 1/cos θ more
	// power than the flash question, which takes the light face on.
	const unit = (v: number[]) => v.map((x) => x / Math.hypot(...v));
	const faceNormal = [0, 0, 1];
	const toRake = unit((rake.position as number[]).map((v, i) => v - scene.subject.position[i]));
	const cosIncidence = faceNormal.reduce((sum, v, i) => sum + v * toRake[i], 0);
	const required = flash.requiredPower / cosIncidence;
	expect(shownStep).toBe(nearestPowerStep(required).label);
	const exactShown = Number((await rakeLine.textContent())!.match(/exactly ([\d.e+-]+) of full/)![1]);
	expect(Math.abs(exactShown - required) / required).toBeLessThan(0.01);

	// Save with a message: the revision number goes up and the history holds the message.
	await inspectorTab(page, 'Save');
	const revisionShown = page.getByTestId('revision-number');
	const startRevision = Number(await revisionShown.textContent());
	await page.getByLabel('What changed (optional)').fill('Stopped down to f/16 for depth');
	await page.getByRole('button', { name: 'Save revision' }).click();
	await expect(revisionShown).toHaveText(String(startRevision + 1));
	await expect(page.getByText(`Saved as revision ${startRevision + 1}.`)).toBeVisible();
	const revisions = await (await page.request.get(`/api/v1/setups/${id}/revisions`)).json();
	expect(revisions[0]).toMatchObject({ number: startRevision + 1, message: 'Stopped down to f/16 for depth' });
	const saved = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	expect(saved.document.scene.camera.aperture).toBe(16);
	expect(saved.revisionNumber).toBe(startRevision + 1);
});

test("a light takes a modifier from the studio's gear shelf, and the saved revision keeps a copy of it", async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const id = await freshCopy(page, await seededId(page, AMMONITE), 'shelf');
	await openPlan(page, id);
	await page.getByTestId('element-list').getByRole('button', { name: /, Flash, at / }).first().click();
	const modifier = page.getByLabel(/^Modifier on /);
	// The studio's shelf (seeded: a grid, a softbox and a dome, listed by name) is offered beside the typical modifiers.
	await expect(modifier.locator('optgroup[label="From the gear shelf"] option')).toHaveText([
		'Honeycomb grid, 25° (−0.7 stops)',
		'Larkspur 30 cm softbox (−1.7 stops)',
		'Opal diffuser dome (−1 stop)'
	]);
	await modifier.selectOption({ label: 'Larkspur 30 cm softbox (−1.7 stops)' });
	await inspectorTab(page, 'Save');
	await page.getByLabel('What changed (optional)').fill('Softbox from the shelf');
	await page.getByRole('button', { name: 'Save revision' }).click();
	await expect(page.getByText(/Saved as revision 2\./)).toBeVisible();

	const saved = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	const SOFTBOX = '7e1a9b30-4c2d-4f1e-9a0b-00000000b001';
	const [lightId] = Object.entries(saved.document.plan.elements as Record<string, { modifier?: { gearId?: string } }>).find(([, el]) => el.modifier?.gearId === SOFTBOX)!;
	expect(saved.document.gear).toContainEqual(expect.objectContaining({ id: SOFTBOX, kind: 'modifier', name: 'Larkspur 30 cm softbox' }));
	const light = (saved.document.scene.lights as { id: string; lossStops?: number; beamAngleDeg?: number }[]).find((l) => l.id === lightId)!;
	expect(light.lossStops).toBeGreaterThanOrEqual(1.7 - 1e-9); // the shelf's measured loss, plus any other
	expect(light.beamAngleDeg).toBe(90);
});

test('unsaved work survives a reload, and a stale save says someone saved since and saves on top, losing nothing', async ({
	page,
	context,
	browser,
	baseURL
}) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const seeded = await seededId(page, AMMONITE);
	const id = await freshCopy(page, seeded, 'draft test');
	await openPlan(page, id);

	await inspectorTab(page, 'Camera');
	const iso = page.getByLabel('ISO');
	await iso.fill('200');
	await iso.press('Tab');
	await inspectorTab(page, 'Save');
	await expect(page.getByTestId('revision-status')).toContainText('unsaved changes');
	// The draft is written a moment after the last change.
	await expect
		.poll(async () => page.evaluate((key) => localStorage.getItem(key), `squarelaw:plan-draft:${id}`))
		.toContain('"iso":200');

	await page.reload();
	await page.waitForLoadState('networkidle');
	await expect(page.getByText(/were restored from this browser/)).toBeVisible();
	await inspectorTab(page, 'Camera');
	await expect(page.getByLabel('ISO')).toHaveValue('200');

	// Meanwhile someone else saves a revision on the same base.
	const current = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	const other = await page.request.put(`/api/v1/setups/${id}`, {
		data: { baseRevision: current.revisionNumber, document: { ...current.document, notes: 'Theirs: grey card under the fossil.' }, message: 'Saved from another window' }
	});
	expect(other.status()).toBe(200);
	const theirs = (await other.json()).revisionNumber as number;

	await inspectorTab(page, 'Save');
	await page.getByLabel('What changed (optional)').fill('ISO 200');
	await page.getByRole('button', { name: 'Save revision' }).click();
	// Inline: which revision came in, and what it changed in words (the notebook's comparison).
	const conflict = page.getByTestId('save-conflict');
	await expect(conflict).toContainText(`revision ${theirs} is now the latest`);
	await expect(conflict).toContainText(`Revision ${theirs} by`);
	await expect(conflict).toContainText('Saved from another window');
	await expect(conflict).toContainText(/notes/i);
	await inspectorTab(page, 'Camera');
	await expect(page.getByLabel('ISO')).toHaveValue('200');
	await inspectorTab(page, 'Save');
	await page.getByRole('button', { name: `Save on top of revision ${theirs}` }).click();
	await expect(page.getByTestId('revision-number')).toHaveText(String(theirs + 1));

	const saved = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	expect(saved.document.scene.camera.iso).toBe(200);
	// Saving on top kept their notes: the editor does not change notes, so nothing of theirs is lost.
	expect(saved.document.notes).toBe('Theirs: grey card under the fossil.');
	const revisions = (await (await page.request.get(`/api/v1/setups/${id}/revisions`)).json()) as { number: number; message: string }[];
	expect(revisions.slice(0, 2).map((r) => [r.number, r.message])).toEqual([
		[theirs + 1, 'ISO 200'],
		[theirs, 'Saved from another window']
	]);
	// Saved: the draft is gone, so a reload shows the saved plan without a restore notice.
	await page.reload();
	await page.waitForLoadState('networkidle');
	await expect(page.getByLabel('ISO')).toHaveValue('200');
	await expect(page.getByText(/were restored/)).toHaveCount(0);
});

test('the editor at phone width in dark mode: the plan is on top, the inspector a sheet over it, and nothing runs off the side', async ({
	page,
	context,
	browser,
	baseURL
}) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const seeded = await seededId(page, AMMONITE);
	await page.setViewportSize({ width: 390, height: 844 });
	await page.emulateMedia({ colorScheme: 'dark' });
	await page.addInitScript(() => document.documentElement.classList.add('dark'));
	await openPlan(page, seeded);
	await page.getByTestId('workspace').evaluate((el) => el.scrollIntoView({ block: 'start' }));
	await inspectorTab(page, 'Exposure');
	const canvasBox = (await page.getByTestId('plan-canvas').boundingBox())!;
	const panelBox = (await page.getByTestId('exposure-panel').boundingBox())!;
	expect(canvasBox.width).toBeLessThanOrEqual(390);
	// The tab opened the sheet half-way up over the plan (tests/editor-phone.spec.ts tries the sheet in full).
	await expect(page.getByTestId('inspector-column')).toHaveAttribute('data-sheet', 'half');
	expect(panelBox.y).toBeGreaterThan(canvasBox.y + canvasBox.height / 3);
	expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
	// The inspector shows one tab at a time: another tab puts the exposure panel away.
	await inspectorTab(page, 'Element');
	await expect(page.getByTestId('exposure-panel')).toBeHidden();
	await expect(page.getByTestId('element-list')).toBeVisible();
	await expect(page.locator('html')).toHaveClass(/dark/);
});

test('a viewer gets the plan read-only, with the exposure but no editing panels', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, VIEWER);
	const seeded = await seededId(page, AMMONITE);
	await openPlan(page, seeded);
	await expect(page.getByText("You can view this plan; only the studio's editors can change it.")).toBeVisible();
	await expect(page.getByTestId('plan-canvas')).toHaveAttribute('inert', '');
	await expect(page.getByTestId('exposure-panel').getByTestId('aperture-table')).toBeVisible();
	await expect(page.getByRole('button', { name: 'Save revision' })).toHaveCount(0);
	await expect(page.getByRole('button', { name: 'Add element' })).toHaveCount(0);
	await expect(page.getByRole('button', { name: 'Undo' })).toHaveCount(0);

	// A viewer may still take the plan away as a picture.
	const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export PNG' }).click()]);
	expect(download.suggestedFilename()).toMatch(/\.png$/);
	const bytes = fs.readFileSync(await download.path());
	expect([...bytes.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]); // the PNG signature
});

test('printing in the dim theme still puts a light plan on paper', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const seeded = await seededId(page, AMMONITE);
	await openPlan(page, seeded);
	await page.evaluate(() => document.documentElement.classList.add('dark'));
	// The sheet's plan is taken from the stage a moment after the page is live (the stage is not drawn in print).
	const img = page.getByTestId('setup-sheet').locator('img').first();
	await expect(img).toHaveAttribute('src', /^data:image\/png/);
	await page.emulateMedia({ media: 'print' });
	/** Mean brightness (0–255) of the top-left corner of the sheet's plan image (bare table), read through a canvas. */
	const brightness = () =>
		img.evaluate(async (el: HTMLImageElement) => {
			await el.decode();
			const c = document.createElement('canvas');
			c.width = el.naturalWidth;
			c.height = el.naturalHeight;
			const g = c.getContext('2d')!;
			g.drawImage(el, 0, 0);
			const { data } = g.getImageData(0, 0, 12, 12);
			let sum = 0;
			for (let i = 0; i < data.length; i += 4) sum += (data[i] + data[i + 1] + data[i + 2]) / 3;
			return sum / (data.length / 4);
		});
	// The stage on screen is dark; the printed plan is taken in the light theme.
	await expect.poll(brightness).toBeGreaterThan(170);
	expect(await page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
});
