// The plan editor at phone width with a touch screen: one finger drags a light (its new coordinates
// read from the element list), two fingers pinch the plan (the zoom read from the plan's data-zoom).
// Touches go through Chromium's DevTools protocol (Input.dispatchTouchEvent), as a real screen's would.
import type { CDPSession, Page } from '@playwright/test';
import { createQuartzSetup, expect, signedInAs, test } from './fixtures';

const OWNER = 'mara.quill@fernhill.example';

test.use({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true });

interface View {
	zoom: number;
	panX: number;
	panY: number;
	left: number;
	top: number;
}

async function view(page: Page): Promise<View> {
	const plan = page.getByRole('application', { name: /Plan of the setup/ });
	const box = (await plan.boundingBox())!;
	const read = async (name: string) => Number(await plan.getAttribute(name));
	return { zoom: await read('data-zoom'), panX: await read('data-pan-x'), panY: await read('data-pan-y'), left: box.x, top: box.y };
}

/** A plan point in page CSS pixels. */
const onScreen = (v: View, xM: number, yM: number) => ({ x: v.left + v.panX + xM * v.zoom, y: v.top + v.panY + yM * v.zoom });

async function touch(cdp: CDPSession, type: 'touchStart' | 'touchMove' | 'touchEnd', points: { x: number; y: number }[]) {
	await cdp.send('Input.dispatchTouchEvent', {
		type,
		touchPoints: points.map((p, i) => ({ x: Math.round(p.x), y: Math.round(p.y), id: i + 1, radiusX: 4, radiusY: 4, force: 1 }))
	});
}

/** Reads "x, y" of the light from its row in the element list (in the inspector sheet, collapsed or not), in centimetres. */
async function lightAt(page: Page): Promise<[number, number]> {
	const name = await page.getByTestId('element-list').getByRole('button', { name: /, Flash, at /, includeHidden: true }).textContent();
	const m = name!.match(/at (-?[\d.]+) cm, (-?[\d.]+) cm/);
	expect(m, `coordinates in "${name}"`).toBeTruthy();
	return [Number(m![1]), Number(m![2])];
}

test('at phone width, one finger drags a light and two fingers pinch-zoom the plan', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const id = await createQuartzSetup(page, 'Touch test');
	await page.goto(`/setups/${id}`);
	await page.waitForLoadState('networkidle');
	const canvas = page.getByTestId('plan-canvas');
	await expect(canvas.locator('canvas').first()).toBeVisible();
	await canvas.scrollIntoViewIfNeeded();
	expect((await canvas.boundingBox())!.width).toBeLessThanOrEqual(390);
	expect(await lightAt(page)).toEqual([-30, 0]);

	const cdp = await context.newCDPSession(page);

	// One finger: press on the flash and drag it 60 px to the right, in small steps as a finger moves.
	let v = await view(page);
	const start = onScreen(v, -0.3, 0);
	await touch(cdp, 'touchStart', [start]);
	for (let i = 1; i <= 12; i++) await touch(cdp, 'touchMove', [{ x: start.x + 5 * i, y: start.y }]);
	await touch(cdp, 'touchEnd', []);
	// 60 px at the plan's zoom (px per metre), in cm; snapping to the grid may round it to a grid step.
	const expectedCm = -30 + (60 / v.zoom) * 100;
	await expect.poll(async () => (await lightAt(page))[0]).not.toBe(-30);
	const [xCm, yCm] = await lightAt(page);
	expect(Math.abs(xCm - expectedCm)).toBeLessThan(2.5);
	expect(Math.abs(yCm)).toBeLessThan(2.5);
	// The drag was one undo step: the toolbar's Undo puts the flash back.
	await page.getByRole('button', { name: 'Undo' }).click();
	await expect.poll(() => lightAt(page)).toEqual([-30, 0]);
	// Selecting the flash brought the inspector sheet up over the plan; a tap on its handle puts it away.
	const sheetHandle = page.getByRole('button', { name: 'Inspector sheet' });
	await expect(sheetHandle).toHaveAttribute('aria-expanded', 'true');
	await sheetHandle.tap();
	await expect(sheetHandle).toHaveAttribute('aria-expanded', 'false');

	// Two fingers on empty plan, moved apart from 100 px to 200 px: the zoom doubles about their midpoint.
	v = await view(page);
	const mid = onScreen(v, 0.05, 0.1);
	const zoomBefore = v.zoom;
	await touch(cdp, 'touchStart', [{ x: mid.x - 50, y: mid.y }]);
	await touch(cdp, 'touchStart', [
		{ x: mid.x - 50, y: mid.y },
		{ x: mid.x + 50, y: mid.y }
	]);
	for (let i = 1; i <= 10; i++) {
		await touch(cdp, 'touchMove', [
			{ x: mid.x - 50 - 5 * i, y: mid.y },
			{ x: mid.x + 50 + 5 * i, y: mid.y }
		]);
	}
	await touch(cdp, 'touchEnd', []);
	await expect.poll(async () => (await view(page)).zoom).not.toBe(zoomBefore);
	v = await view(page);
	expect(v.zoom / zoomBefore).toBeCloseTo(2, 1);
	// The plan point under the fingers' midpoint stays under it.
	const back = onScreen(v, 0.05, 0.1);
	expect(Math.abs(back.x - mid.x)).toBeLessThan(2);
	expect(Math.abs(back.y - mid.y)).toBeLessThan(2);
	// A pinch changes the view only: nothing moved, nothing to undo beyond the drag already undone.
	expect(await lightAt(page)).toEqual([-30, 0]);

	// The selected light's what-if control fits the phone's width too.
	await sheetHandle.tap();
	await page.getByTestId('element-list').getByRole('button', { name: /, Flash, at / }).tap();
	const whatIf = page.getByTestId('what-if');
	await whatIf.scrollIntoViewIfNeeded();
	await expect(whatIf).toBeVisible();
	const box = (await whatIf.boundingBox())!;
	expect(box.x).toBeGreaterThanOrEqual(0);
	expect(box.x + box.width).toBeLessThanOrEqual(390);
	expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
});
