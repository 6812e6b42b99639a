// The editor as a workspace: a setup sketched at 1440×900 without scrolling away from the plan, labels
// that never overlap on the seeded plans, the printed sheet carrying each light's power, what the plan
// says to a screen reader, and screenshots at desktop, dim and phone widths in the report.
import type { Page, TestInfo } from '@playwright/test';
import { extractText, getDocumentProxy } from 'unpdf';
import { expect, signedInAs, test } from './fixtures';
import { inspectorTab } from './workspace';

const OWNER = 'mara.quill@fernhill.example';
const SEEDED = ['Quartz cluster on black velvet', 'Ammonite section, raking light from the left', 'Dew-covered moss on the window sill', 'Amethyst geode on black velvet'];

async function seededId(page: Page, title: string): Promise<string> {
	const res = await page.request.get(`/api/v1/setups?q=${encodeURIComponent(title)}&pageSize=50`);
	expect(res.status()).toBe(200);
	const hit = ((await res.json()).items as { id: string; title: string }[]).find((s) => s.title === title);
	expect(hit, `seeded setup "${title}"`).toBeTruthy();
	return hit!.id;
}

async function openPlan(page: Page, path: string) {
	await page.goto(path);
	await page.waitForLoadState('networkidle');
	await expect(page.getByTestId('plan-canvas').locator('canvas').first()).toBeVisible();
}

async function attachScreenshot(page: Page, testInfo: TestInfo, name: string) {
	await testInfo.attach(name, { body: await page.screenshot({ fullPage: false }), contentType: 'image/png' });
}

type Box = { id: string; x0: number; y0: number; x1: number; y1: number };
const overlap = (a: Box, b: Box) => a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;

test('at 1440×900 a new setup is sketched (subject, flash, card, flag) without scrolling away from the plan', async ({ page, context, browser, baseURL }, testInfo) => {
	await signedInAs(context, browser, baseURL, OWNER);
	await page.setViewportSize({ width: 1440, height: 900 });
	await openPlan(page, '/setups/new?title=Sketch');
	// Scrolled to once, the workspace fits the window: toolbar, exposure strip, plan and inspector.
	await page.getByTestId('workspace').evaluate((el) => el.scrollIntoView({ block: 'start' }));
	const scrollY = await page.evaluate(() => window.scrollY);
	const inView = async (testid: string) => {
		const b = (await page.getByTestId(testid).boundingBox())!;
		expect(b.y, `${testid} top`).toBeGreaterThanOrEqual(0);
		expect(b.y + b.height, `${testid} bottom`).toBeLessThanOrEqual(900);
		return b;
	};
	const plan = await inView('plan-canvas');
	expect(plan.height).toBeGreaterThan(600); // the plan fills the window's height
	await inView('exposure-strip');
	const list = page.getByTestId('element-list');
	await expect(list.getByRole('button', { name: /^Subject, Subject, at / })).toBeVisible();

	const tools = page.getByRole('toolbar', { name: 'Plan tools' });
	const spots: [string, number, number][] = [
		['Flash', 0.25, 0.3],
		['Reflector', 0.75, 0.35],
		['Flag', 0.3, 0.6]
	];
	for (const [kind, fx, fy] of spots) {
		await tools.getByRole('button', { name: kind, exact: true }).click();
		await page.mouse.click(plan.x + plan.width * fx, plan.y + plan.height * fy);
		await expect(list.getByRole('button', { name: new RegExp(`^${kind}, ${kind}, at `) })).toBeVisible();
		// The new element's properties are beside the plan, in view, while the plan stays where it was.
		const label = page.getByLabel('Label', { exact: true });
		await expect(label).toHaveValue(kind);
		const lb = (await label.boundingBox())!;
		expect(lb.y + lb.height).toBeLessThanOrEqual(900);
		expect(lb.x).toBeGreaterThan(plan.x + plan.width - 1);
		expect(await page.evaluate(() => window.scrollY)).toBe(scrollY);
	}
	await expect(list.getByRole('listitem')).toHaveCount(5); // subject, camera and the three
	await inView('plan-canvas');
	await expect(page.getByTestId('exposure-strip')).toContainText(/At f\//);
	await attachScreenshot(page, testInfo, 'desktop 1440×900: a new setup sketched');
});

test('labels and dimension texts never overlap on any seeded plan, in the light and the dim theme and at phone width', async ({ page, context, browser, baseURL }, testInfo) => {
	test.setTimeout(120_000);
	await signedInAs(context, browser, baseURL, OWNER);
	const ids = [];
	for (const title of SEEDED) ids.push(await seededId(page, title));
	const views = [
		{ name: 'desktop', width: 1440, height: 900, dark: false },
		{ name: 'dim', width: 1440, height: 900, dark: true },
		{ name: 'phone', width: 390, height: 844, dark: false }
	];
	for (const view of views) {
		await page.setViewportSize({ width: view.width, height: view.height });
		for (const [i, id] of ids.entries()) {
			await openPlan(page, `/setups/${id}`);
			if (view.dark) await page.evaluate(() => document.documentElement.classList.add('dark'));
			const stage = page.getByRole('application', { name: /Plan of the setup/ });
			const boxes = JSON.parse((await stage.getAttribute('data-annotations'))!) as Box[];
			const labels = boxes.filter((b) => b.id.startsWith('label:'));
			expect(labels.length, `${SEEDED[i]}: labels placed`).toBeGreaterThan(1);
			const clashes: string[] = [];
			for (let a = 0; a < boxes.length; a++) for (let b = a + 1; b < boxes.length; b++) if (overlap(boxes[a], boxes[b])) clashes.push(`${boxes[a].id} × ${boxes[b].id}`);
			expect(clashes, `${SEEDED[i]} (${view.name})`).toEqual([]);
			if (i === 0) {
				await page.getByTestId('workspace').evaluate((el) => el.scrollIntoView({ block: 'start' }));
				await attachScreenshot(page, testInfo, `${view.name} ${view.width}×${view.height}: ${SEEDED[i]}`);
			}
		}
	}
});

test("the printed sheet's PDF holds each light's power, guide number and distance, and Export PNG carries a title block", async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const id = await seededId(page, SEEDED[0]);
	const setup = await (await page.request.get(`/api/v1/setups/${id}`)).json();
	const flashes = (setup.document.scene.lights as { id: string; kind: string; power?: number; guideNumber?: number }[]).filter((l) => l.kind === 'flash');
	expect(flashes.length).toBeGreaterThan(0);
	await openPlan(page, `/setups/${id}`);
	await expect(page.getByTestId('setup-sheet').locator('img').first()).toHaveAttribute('src', /^data:image\/png/);
	const pdf = await page.pdf({ format: 'A4', printBackground: true });
	const { text } = await extractText(await getDocumentProxy(new Uint8Array(pdf)), { mergePages: true });
	const flat = (text as string).replace(/\s+/g, ' ');
	expect(flat).toContain('The lights as set');
	for (const f of flashes) {
		// Powers on the flash's ladder read 1/2, 1/4 … (the seeded flashes are set on whole stops).
		const stops = Math.log2(1 / f.power!);
		expect(Number.isInteger(stops)).toBe(true);
		expect(flat).toContain(stops === 0 ? '1/1' : `1/${2 ** stops}`);
		expect(flat).toContain(`${f.guideNumber} (m)`);
	}
	// The exported PNG is taller than the plan on screen: the title block sits under its corner.
	const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export PNG' }).click()]);
	const bytes = await (await import('node:fs')).promises.readFile((await download.path())!);
	const canvas = (await page.getByTestId('plan-canvas').boundingBox())!;
	const height = bytes.readUInt32BE(20);
	expect(height / 2).toBeGreaterThan(canvas.height + 20);
});

test('the plan shows its focus ring and says what each key did; the aperture table scrolls by keyboard', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	await openPlan(page, '/setups/new?title=Keys');
	const stage = page.getByRole('application', { name: /Plan of the setup/ });
	// Reach the plan by keyboard: the ring shows, the full size of the plan (nothing clips it).
	await page.getByRole('button', { name: 'Fit the plan' }).focus();
	await page.keyboard.press('Tab');
	let guard = 0;
	while (!(await stage.evaluate((el) => el === document.activeElement)) && guard++ < 12) await page.keyboard.press('Tab');
	await expect(stage).toBeFocused();
	const ring = page.getByTestId('plan-focus-ring');
	await expect(ring).toBeVisible();
	const [rb, sb] = [(await ring.boundingBox())!, (await stage.boundingBox())!];
	expect(rb).toEqual(sb);

	const status = stage.locator('[aria-live="polite"]');
	// N goes through the elements; the camera is the one to turn and delete (every setup keeps its subject).
	await page.keyboard.press('n');
	if (!(await status.textContent())!.startsWith('Camera selected')) await page.keyboard.press('n');
	await expect(status).toContainText('Camera selected');
	const selected = 'Camera';
	await page.keyboard.press('r');
	await expect(status).toHaveText(new RegExp(`^${selected} turned to -?\\d+°\\.$`));
	await page.keyboard.press('Delete');
	await expect(status).toHaveText(`${selected} deleted.`);
	await page.keyboard.press('Control+z');
	await expect(status).toHaveText(`Undone: ${selected} added.`);
	await page.keyboard.press('f');
	await expect(status).toHaveText('Falloff map shown.');
	await page.keyboard.press('+');
	await expect(status).toContainText('Zoomed in');
	// The exposure is computed on every change: nothing says "recomputing" while keys are pressed.
	await expect(page.getByText(/recomputing/i)).toHaveCount(0);

	await inspectorTab(page, 'Exposure');
	const scroller = page.getByRole('region', { name: 'Exposure at each f-number' }).first();
	await scroller.focus();
	await expect(scroller).toBeFocused();
});
