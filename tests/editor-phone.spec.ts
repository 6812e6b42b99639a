// The plan editor at phone width (390 × 844): the plan fills the window under the toolbar and the
// exposure strip, and the inspector is a sheet over it that slides up: selecting a light opens it on
// the light's properties, Escape, a tap on the handle or a drag of the handle put it away, and the plan
// is usable again. Nothing runs off the side, in the light or the dim theme.
import type { Page } from '@playwright/test';
import { createQuartzSetup, expect, signedInAs, test } from './fixtures';

const OWNER = 'mara.quill@fernhill.example';

test.use({ viewport: { width: 390, height: 844 } });

/** The flash's place on the page, from the plan's view attributes (plan metres → CSS pixels). */
async function lightOnScreen(page: Page, xM: number, yM: number) {
	const plan = page.getByRole('application', { name: /Plan of the setup/ });
	const box = (await plan.boundingBox())!;
	const read = async (name: string) => Number(await plan.getAttribute(name));
	const zoom = await read('data-zoom');
	return { x: box.x + (await read('data-pan-x')) + xM * zoom, y: box.y + (await read('data-pan-y')) + yM * zoom };
}

/** "x, y" of the flash from its row in the element list (in the collapsed sheet, so hidden), in centimetres. */
async function lightAt(page: Page): Promise<[number, number]> {
	const name = await page.getByTestId('element-list').getByRole('button', { name: /, Flash, at /, includeHidden: true }).textContent();
	const m = name!.match(/at (-?[\d.]+) cm, (-?[\d.]+) cm/);
	return [Number(m![1]), Number(m![2])];
}

const top = async (page: Page, testId: string) => (await page.getByTestId(testId).boundingBox())!;

for (const theme of ['light', 'dim'] as const) {
	test(`at phone width the plan is on top and the inspector is a sheet that slides up (${theme})`, async ({ page, context, browser, baseURL }, testInfo) => {
		await signedInAs(context, browser, baseURL, OWNER);
		if (theme === 'dim') {
			await page.emulateMedia({ colorScheme: 'dark' });
			await page.addInitScript(() => document.documentElement.classList.add('dark'));
		}
		const id = await createQuartzSetup(page, 'Phone sheet');
		await page.goto(`/setups/${id}`);
		await page.waitForLoadState('networkidle');
		await expect(page.getByTestId('plan-canvas').locator('canvas').first()).toBeVisible();
		await page.getByTestId('workspace').evaluate((el) => el.scrollIntoView({ block: 'start' }));

		// The sheet rests collapsed at the foot of the window, showing its handle and tabs under the plan.
		const sheet = page.getByTestId('inspector-column');
		const handle = page.getByRole('button', { name: 'Inspector sheet' });
		await expect(sheet).toHaveAttribute('data-sheet', 'collapsed');
		await expect(handle).toHaveAttribute('aria-expanded', 'false');
		await expect(page.getByRole('tablist', { name: 'Inspector' })).toBeVisible();
		await expect(page.getByTestId('element-list')).toBeHidden();
		const plan = await top(page, 'plan-canvas');
		let sheetBox = (await sheet.boundingBox())!;
		expect(sheetBox.y + sheetBox.height).toBeCloseTo(844, 0);
		expect(sheetBox.height).toBeLessThan(120);
		// The plan fills what the toolbar, the strip and the collapsed sheet leave of the window.
		expect(plan.y).toBeGreaterThanOrEqual(0);
		expect(plan.y + plan.height).toBeLessThanOrEqual(sheetBox.y + 1);
		expect(plan.height).toBeGreaterThan(844 * 0.5);
		expect(plan.width).toBeLessThanOrEqual(390);
		await testInfo.attach(`phone ${theme}: sheet collapsed`, { body: await page.screenshot(), contentType: 'image/png' });

		// Selecting the light on the plan opens the sheet on its properties, and the light stays in view above it.
		const light = await lightOnScreen(page, -0.3, 0);
		await page.mouse.click(light.x, light.y);
		await expect(sheet).toHaveAttribute('data-sheet', 'half');
		await expect(handle).toHaveAttribute('aria-expanded', 'true');
		const inspector = page.getByTestId('inspector');
		await expect(inspector.getByLabel('Power', { exact: true })).toBeVisible();
		await expect(inspector.getByLabel('Power', { exact: true })).toBeInViewport();
		sheetBox = (await sheet.boundingBox())!;
		expect(sheetBox.height).toBeGreaterThan(844 * 0.4);
		await expect.poll(async () => (await lightOnScreen(page, -0.3, 0)).y).toBeLessThan(sheetBox.y);
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
		if (theme === 'dim') {
			// The sheet is drawn in the dim theme's colours, not left white.
			const bg = await sheet.evaluate((el) => getComputedStyle(el).backgroundColor);
			const [r, g, b] = bg.match(/\d+/g)!.map(Number);
			expect((r + g + b) / 3).toBeLessThan(80);
		}
		await testInfo.attach(`phone ${theme}: sheet open on the light`, { body: await page.screenshot(), contentType: 'image/png' });

		// Escape in the sheet puts it away; the focus goes to the handle, not into what was put away.
		await inspector.getByLabel('Power', { exact: true }).focus();
		await page.keyboard.press('Escape');
		await expect(sheet).toHaveAttribute('data-sheet', 'collapsed');
		await expect(handle).toBeFocused();
		await expect(page.getByTestId('element-list')).toBeHidden();

		// The handle is a button: Enter opens it, the arrow keys move it a stop, Enter again puts it away.
		await page.keyboard.press('Enter');
		await expect(sheet).toHaveAttribute('data-sheet', 'half');
		await page.keyboard.press('ArrowUp');
		await expect(sheet).toHaveAttribute('data-sheet', 'full');
		await page.keyboard.press('ArrowDown');
		await expect(sheet).toHaveAttribute('data-sheet', 'half');
		await page.keyboard.press('Enter');
		await expect(sheet).toHaveAttribute('data-sheet', 'collapsed');

		// Dragged by its handle, the sheet follows the pointer and rests at the nearest stop (read where the
		// handle is once the sheet has finished sliding).
		const settledHandle = async () => {
			await expect.poll(async () => { const a = (await handle.boundingBox())!.y; await page.waitForTimeout(100); return (await handle.boundingBox())!.y === a; }).toBe(true);
			return (await handle.boundingBox())!;
		};
		const h = await settledHandle();
		await page.mouse.move(h.x + h.width / 2, h.y + h.height / 2);
		await page.mouse.down();
		for (let i = 1; i <= 10; i++) await page.mouse.move(h.x + h.width / 2, h.y + h.height / 2 - 65 * i);
		await page.mouse.up();
		await expect(sheet).toHaveAttribute('data-sheet', 'full');
		const g = await settledHandle();
		await page.mouse.move(g.x + g.width / 2, g.y + g.height / 2);
		await page.mouse.down();
		for (let i = 1; i <= 10; i++) await page.mouse.move(g.x + g.width / 2, g.y + g.height / 2 + 70 * i);
		await page.mouse.up();
		await expect(sheet).toHaveAttribute('data-sheet', 'collapsed');

		// With the sheet put away the plan is usable again: the light is dragged 60 px to the right.
		const before = await lightAt(page);
		const from = await lightOnScreen(page, before[0] / 100, before[1] / 100);
		await page.mouse.move(from.x, from.y);
		await page.mouse.down();
		for (let i = 1; i <= 6; i++) await page.mouse.move(from.x + 10 * i, from.y);
		await page.mouse.up();
		await expect.poll(async () => (await lightAt(page))[0]).toBeGreaterThan(before[0] + 2);
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
	});
}

test('at phone width a tab opens the sheet, and with reduced motion it does not slide', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	await page.emulateMedia({ reducedMotion: 'reduce' });
	const id = await createQuartzSetup(page, 'Phone tabs');
	await page.goto(`/setups/${id}`);
	await page.waitForLoadState('networkidle');
	const sheet = page.getByTestId('inspector-column');
	await expect(sheet).toHaveAttribute('data-sheet', 'collapsed');
	expect(await sheet.evaluate((el) => getComputedStyle(el).transitionDuration)).toBe('0s');
	await page.getByRole('tablist', { name: 'Inspector' }).getByRole('tab', { name: 'Exposure', exact: true }).click();
	await expect(sheet).toHaveAttribute('data-sheet', 'half');
	await expect(page.getByTestId('exposure-panel')).toBeVisible();
	await expect(page.getByTestId('exposure-panel').getByTestId('aperture-table')).toBeVisible();
	// Another tab while open keeps the sheet where it is and shows that tab.
	await page.getByRole('tablist', { name: 'Inspector' }).getByRole('tab', { name: 'Camera', exact: true }).click();
	await expect(sheet).toHaveAttribute('data-sheet', 'half');
	await expect(page.getByTestId('exposure-panel')).toBeHidden();
	// Scrolled down past the workspace, the sheet goes with it and leaves the page below uncovered.
	await page.getByRole('button', { name: 'Inspector sheet' }).click();
	await expect(sheet).toHaveAttribute('data-sheet', 'collapsed');
	await page.evaluate(() => window.scrollTo(0, document.documentElement.scrollHeight));
	const workspace = (await page.getByTestId('workspace').boundingBox())!;
	const sheetBox = (await sheet.boundingBox())!;
	expect(sheetBox.y + sheetBox.height).toBeLessThanOrEqual(workspace.y + workspace.height + 1);
});
