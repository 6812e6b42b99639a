// The inspector in a real browser against the real app: flash power typed and shown in the trade's
// notation (common practice: 1/32, 1/8 +0.3 for a third above 1/8) and kept through a save; bad input
// named beside its field with nothing lost and undo working; "set to the power needed" bringing the
// setup within a third of a stop of correct (checked by the server's own recompute); the ambient light
// placed and edited and fed to the scene; and a viewer inspecting a light read-only.
import type { Page } from '@playwright/test';
import { formatPower } from '../src/lib/editor/model/power-notation';
import { createQuartzSetup, expect, signedInAs, test } from './fixtures';
import { inspectorTab } from './workspace';

const OWNER = 'mara.quill@fernhill.example';
const VIEWER = 'ines.marlow@fernhill.example';

async function openSetup(page: Page, id: string) {
	await page.goto(`/setups/${id}`);
	await page.waitForLoadState('networkidle');
	await expect(page.getByTestId('plan-canvas').locator('canvas').first()).toBeVisible();
}

async function typeInto(page: Page, selector: string, text: string) {
	const field = page.locator(selector);
	await field.fill(text);
	await field.press('Enter');
}

async function saveRevision(page: Page, message: string, revision: number) {
	await inspectorTab(page, 'Save');
	await page.getByLabel('What changed (optional)').fill(message);
	await page.getByRole('button', { name: 'Save revision' }).click();
	await expect(page.getByText(`Saved as revision ${revision}.`)).toBeVisible();
}

test('flash power: "1/32" typed is kept and shown as 1/32; bad input is named beside the field, loses nothing, and undo works', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const id = await createQuartzSetup(page, 'Power notation');
	await openSetup(page, id);
	await page.getByTestId('element-list').getByRole('button', { name: /, Flash, at / }).click();
	const power = page.locator('#prop-power');
	await expect(power).toHaveValue('1/8');

	await typeInto(page, '#prop-power', '1/32');
	await expect(power).toHaveValue('1/32');
	await expect(page.locator('#prop-power-error')).toHaveCount(0);

	// Not a power: the message names what to type, the text stays, the model keeps 1/32.
	await typeInto(page, '#prop-power', 'lots');
	await expect(page.locator('#prop-power-error')).toContainText('1/32, 1/8 +0.3, 0.25 or -3 EV');
	await expect(power).toHaveValue('lots');
	// More than full power: the element's own check, beside the same field.
	await typeInto(page, '#prop-power', '+1 EV');
	await expect(page.locator('#prop-power-error')).toContainText('at most 1 (full power)');

	await typeInto(page, '#prop-power', '1/8 +0.3');
	await expect(power).toHaveValue('1/8 +0.3');
	await expect(page.locator('#prop-power-error')).toHaveCount(0);
	await page.getByRole('button', { name: 'Undo' }).click();
	await expect(power).toHaveValue('1/32');

	// Angles read to the degree.
	await expect(page.locator('#prop-rotationDeg')).toHaveValue(/^-?\d+$/);

	await saveRevision(page, 'Flash at 1/32', 2);
	const saved = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	expect(saved.document.scene.lights[0].power).toBe(1 / 32);
	await openSetup(page, id);
	await inspectorTab(page, 'Element');
	await page.getByTestId('element-list').getByRole('button', { name: /, Flash, at / }).click();
	await expect(page.locator('#prop-power')).toHaveValue('1/32');
});

test('"set to the power needed" puts the flash on its nearest step and the setup within a third of a stop, by the server’s recompute', async ({
	page,
	context,
	browser,
	baseURL
}) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const id = await createQuartzSetup(page, 'Power needed');
	await openSetup(page, id);
	// Stop down to f/22 first so the flash's 1/8 is far from right.
	await inspectorTab(page, 'Camera');
	const aperture = page.getByLabel('Aperture (f-number, marked)');
	await aperture.fill('22');
	await aperture.press('Enter');
	await inspectorTab(page, 'Element');
	await page.getByTestId('element-list').getByRole('button', { name: /, Flash, at / }).click();
	const needed = page.getByTestId('power-needed');
	const step = (await needed.getByTestId('power-needed-step').textContent())!.trim();
	await needed.getByRole('button', { name: /^Set to the power needed/ }).click();
	await expect(page.locator('#prop-power')).toHaveValue(step);
	await expect(needed.getByTestId('power-needed-residual')).toHaveText(/^(0 stops|[+−]0\.[0-3] stops?)$/);
	await expect(needed.getByRole('button', { name: /^Set to the power needed/ })).toBeDisabled();

	await saveRevision(page, 'Power as needed at f/22', 2);
	const exposure = await (await page.request.get(`/api/v1/setups/${id}/exposure`)).json();
	expect(Math.abs(exposure.total.exposureOffsetStops)).toBeLessThanOrEqual(1 / 3);
	const saved = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	expect(formatPower(saved.document.scene.lights[0].power)).toBe(step);
});

test('an ambient light is placed and edited in the plan, and its EV is the scene’s ambient', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const id = await createQuartzSetup(page, 'Window light');
	await openSetup(page, id);
	await page.getByLabel('New element').selectOption('ambient');
	await page.getByRole('button', { name: 'Add element' }).click();
	await expect(page.getByTestId('element-list').getByRole('button', { name: /^Ambient light, Ambient light, at / })).toHaveAttribute('aria-pressed', 'true');
	await page.getByLabel('Sky', { exact: true }).selectOption('open-shade');
	await expect(page.locator('#prop-ev100')).toHaveValue('11');
	await typeInto(page, '#prop-ev100', 'bright');
	await expect(page.locator('#prop-ev100-error')).toHaveText('must be a number');
	await typeInto(page, '#prop-ev100', '9.5');
	await expect(page.getByLabel('Sky', { exact: true })).toHaveValue('');
	await saveRevision(page, 'Window light added', 2);
	const saved = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	expect(saved.document.scene.ambient).toEqual({ ev100: 9.5, kelvin: 6500 });
	const entries = Object.values(saved.document.plan.elements as Record<string, { kind: string; source?: string }>);
	expect(entries.filter((e) => e.kind === 'ambient')).toEqual([expect.objectContaining({ source: 'window' })]);
});

test('a viewer selects a light of a seeded setup and sees its properties read-only', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, VIEWER);
	const res = await page.request.get(`/api/v1/setups?q=${encodeURIComponent('Ammonite section')}&pageSize=50`);
	const seeded = ((await res.json()).items as { id: string; title: string }[]).find((s) => s.title === 'Ammonite section, raking light from the left')!;
	const setup = await (await page.request.get(`/api/v1/setups/${seeded.id}`)).json();
	const rake = setup.document.scene.lights.find((l: { id: string }) => l.id === 'rake');
	await openSetup(page, seeded.id);

	await inspectorTab(page, 'Elements');
	const inspector = page.getByTestId('inspector');
	await inspectorTab(page, 'Elements');
	await inspector.getByRole('button', { name: 'Marten 24, grid, raking' }).click();
	await expect(inspector.getByText('Flash · read-only')).toBeVisible();
	await expect(page.locator('#prop-power')).toHaveValue(formatPower(rake.power));
	await expect(page.locator('#prop-power')).toHaveAttribute('readonly', '');
	await expect(page.locator('#prop-guideNumber')).toHaveValue(String(rake.guideNumber));
	await expect(page.locator('#prop-heightM')).toHaveValue(/cm$/);
	await expect(page.locator('#prop-gearId')).toBeDisabled();
	await expect(inspector.getByTestId('power-needed')).toContainText('Nearest step');
	await expect(inspector.getByRole('button', { name: /Set to the power needed|Delete|Duplicate|Lock/ })).toHaveCount(0);
	await expect(page.getByRole('button', { name: 'Save revision' })).toHaveCount(0);
});

test('the camera tab: a close-up lens costs no light and a 2× teleconverter two stops, as the engine says, and both are kept through a save', async ({
	page,
	context,
	browser,
	baseURL
}) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const id = await createQuartzSetup(page, 'Close-up lens');
	await openSetup(page, id);
	const working = page.getByTestId('strip-working');
	const keyStops = async () => {
		await inspectorTab(page, 'Exposure');
		const stops = Number(await page.getByTestId('exposure-panel').locator('[data-light-stops]').first().getAttribute('data-light-stops'));
		await inspectorTab(page, 'Camera');
		return stops;
	};
	// Extension (the default): N_w = N(1 + m/P) = 16 × (1 + 0.5) = 24 (the working-aperture formula of
	// /api/v1/openapi.json; any close-up photography text).
	await expect(working).toHaveText('f/24');
	const byExtension = await keyStops();

	// A close-up lens on a lens focused at infinity leaves the image at the focal plane: no light lost,
	// N_w = N = 16, so the key gains 2·log2(24/16) = 1.17 stops (exposure goes with 1/N_w²).
	await page.getByLabel('Magnification made by').selectOption('close-up-lens');
	await expect(working).toHaveText('f/16');
	const byCloseUpLens = await keyStops();
	expect(byCloseUpLens - byExtension).toBeCloseTo(2 * Math.log2(24 / 16), 6);

	// A 2× teleconverter doubles the f-number (common practice: it costs two stops): f/32, −2 stops.
	await page.getByLabel('Teleconverter', { exact: true }).selectOption('2');
	await expect(working).toHaveText('f/32');
	expect((await keyStops()) - byCloseUpLens).toBeCloseTo(-2, 6);

	// A factor below 1 is no teleconverter: refused beside the field, nothing changes.
	await page.getByLabel('Teleconverter', { exact: true }).selectOption('other');
	await typeInto(page, '#camera-teleconverterFactor', '0.5');
	await expect(page.locator('#camera-teleconverterFactor-error')).toContainText('teleconverterFactor must be at least 1');
	await expect(working).toHaveText('f/32');

	// The Exposure tab says which depth-of-field formula answered: the plan's camera gives a focal length.
	await inspectorTab(page, 'Exposure');
	await expect(page.getByTestId('depth-of-field')).toContainText('thin-lens formula');

	await saveRevision(page, 'Close-up lens and 2× converter', 2);
	const saved = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	expect(saved.document.scene.camera).toMatchObject({ magnificationBy: 'close-up-lens', teleconverterFactor: 2, focalLengthMm: expect.any(Number) });
	expect(saved.document.scene.camera.position).toHaveLength(3);
	const exposure = await (await page.request.get(`/api/v1/setups/${id}/exposure`)).json();
	expect(exposure.workingAperture).toBeCloseTo(32, 9);

	await openSetup(page, id);
	await inspectorTab(page, 'Camera');
	await expect(page.getByLabel('Magnification made by')).toHaveValue('close-up-lens');
	await expect(page.getByLabel('Teleconverter', { exact: true })).toHaveValue('2');
});
