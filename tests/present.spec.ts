// The present view in a real browser: a lesson of three steps built on the seeded quartz setup (key
// alone, key + card, key + card + flag) presented with the keyboard, the key light moved and its power
// changed live with the numbers following, and the presenter window following the projector both ways.
import { expect, signedInAs, test } from './fixtures';
import { accessibilityProblems, CAPTIONS, makeLiveWorld, openDb } from './live-world';

const sql = openDb();
import type { Page } from '@playwright/test';

const OWNER = 'mara.quill@fernhill.example';

test.afterAll(async () => {
	await sql.end({ timeout: 5 });
});

/** The exposure offset shown, in stops. */
async function offset(page: Page): Promise<number> {
	const text = (await page.getByTestId('present-offset').textContent())!.trim();
	return Number(text.replace('−', '-'));
}

test('presents a lesson with the keyboard, shows each step’s lights, moves the key live, the presenter window follows, and ends the live session', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const world = await makeLiveWorld(sql, page.request);
	await page.goto(`/workshops/${world.workshopId}/present/${world.lessonId}`);
	const view = page.getByTestId('present-view');
	const caption = page.getByTestId('present-caption');
	await expect(caption).toHaveText(CAPTIONS[0]);
	await expect(page.getByTestId('present-counter')).toHaveText('Step 1 of 3');
	await expect(view.locator('[data-testid="plan-canvas"] canvas').first()).toBeVisible();
	// The dim room is the default: dark paper and light ink.
	await expect(view).toHaveClass(/\bdark\b/);
	await expect(page.getByTestId('live-status')).toHaveText('Live for followers');
	expect(await accessibilityProblems(page)).toEqual([]);

	// The key alone: no card in the exposure, so there is no fill and the offset is the key's.
	const keyAlone = await offset(page);
	await expect(page.getByTestId('present-power')).toContainText('Kestrel 40 in softbox');

	// Next with the arrow, Page Down and Space; back with Page Up; Home and End.
	await page.keyboard.press('ArrowRight');
	await expect(caption).toHaveText(CAPTIONS[1]);
	// The card adds light: the whole exposure is brighter than the key alone.
	await expect.poll(() => offset(page)).toBeGreaterThan(keyAlone);
	await page.keyboard.press('PageDown');
	await expect(caption).toHaveText(CAPTIONS[2]);
	await expect(page.getByTestId('present-counter')).toHaveText('Step 3 of 3');
	await page.keyboard.press(' ');
	await expect(caption).toHaveText(CAPTIONS[2]);
	await page.keyboard.press('PageUp');
	await expect(caption).toHaveText(CAPTIONS[1]);
	await page.keyboard.press('Home');
	await expect(caption).toHaveText(CAPTIONS[0]);
	await page.keyboard.press('End');
	await expect(caption).toHaveText(CAPTIONS[2]);
	await page.keyboard.press('ArrowLeft');
	await page.keyboard.press('ArrowUp');
	await expect(caption).toHaveText(CAPTIONS[0]);
	expect(await offset(page)).toBeCloseTo(keyAlone, 5);

	// B blanks the screen, B again brings the step back.
	await page.keyboard.press('b');
	await expect(page.getByTestId('present-blank')).toBeVisible();
	await page.keyboard.press('b');
	await expect(page.getByTestId('present-blank')).toHaveCount(0);

	// Power a third of a stop up: the offset rises by a third of a stop (X ∝ power; common practice).
	const before = await offset(page);
	await page.getByRole('button', { name: 'A third of a stop more power' }).click();
	await expect.poll(() => offset(page)).toBeCloseTo(before + 0.3, 0);
	expect(await offset(page)).toBeGreaterThan(before);
	await page.getByRole('button', { name: 'Back to the step' }).click();
	await expect.poll(() => offset(page)).toBeCloseTo(before, 5);

	// Drag the key light twice as far from the cluster: less light on the subject, and nothing saved.
	const plan = page.getByRole('application', { name: /Plan of the step/ });
	const box = (await plan.boundingBox())!;
	const read = async (name: string) => Number(await plan.getAttribute(name));
	const [zoom, panX, panY] = [await read('data-zoom'), await read('data-pan-x'), await read('data-pan-y')];
	const at = (x: number, y: number) => ({ x: box.x + panX + x * zoom, y: box.y + panY + y * zoom });
	// The seeded key's softbox front stands at (−30 cm, 20 cm); grab it 3 cm behind the front (inside the
	// softbox as drawn, away from the subject) and move that point twice as far out.
	const [ux, uy] = [-0.3 / Math.hypot(0.3, 0.2), 0.2 / Math.hypot(0.3, 0.2)];
	const from = at(-0.3 + 0.03 * ux, 0.2 + 0.03 * uy);
	const to = at(-0.6 + 0.03 * ux, 0.4 + 0.03 * uy);
	await page.mouse.move(from.x, from.y);
	await page.keyboard.down('Alt');
	await page.mouse.down();
	await page.mouse.move(to.x, to.y, { steps: 10 });
	await page.mouse.up();
	await page.keyboard.up('Alt');
	await expect.poll(() => offset(page)).toBeLessThan(before - 0.5);
	await expect(page.getByRole('button', { name: 'Keep as a new revision…' })).toBeVisible();
	const [{ count: revisionsBefore }] = await sql`select count(*)::int as count from setup_revisions where setup_id = ${world.setupId}`;

	// The presenter window follows the projector, and moves it.
	const [presenter] = await Promise.all([page.waitForEvent('popup'), page.getByRole('button', { name: 'Presenter window' }).click()]);
	await expect(presenter.getByTestId('presenter-counter')).toHaveText('Step 1 of 3');
	await expect(presenter.getByTestId('presenter-notes')).toContainText('Ask the hall which side is darker');
	await expect(presenter.getByTestId('presenter-next')).toHaveText(CAPTIONS[1]);
	await expect(presenter.getByTestId('presenter-elapsed')).toHaveText(/^0:0\d:\d\d$/);
	expect(await accessibilityProblems(presenter)).toEqual([]);
	await page.bringToFront();
	await page.keyboard.press('PageDown');
	await expect(caption).toHaveText(CAPTIONS[1]);
	await expect(presenter.getByTestId('presenter-caption')).toHaveText(CAPTIONS[1]);
	await presenter.getByRole('button', { name: 'Next' }).click();
	await expect(caption).toHaveText(CAPTIONS[2]);
	await expect(presenter.getByTestId('presenter-next')).toHaveText('The last step.');
	await presenter.keyboard.press('Home');
	await expect(caption).toHaveText(CAPTIONS[0]);
	// The what-if was forgotten with the step change and never saved.
	await expect.poll(() => offset(page)).toBeCloseTo(keyAlone, 5);
	const [{ count: revisionsAfter }] = await sql`select count(*)::int as count from setup_revisions where setup_id = ${world.setupId}`;
	expect(revisionsAfter).toBe(revisionsBefore);
	// The projector published each step: the workshop's live position is the step on screen.
	await expect.poll(async () => (await sql`select live_step_id from workshops where id = ${world.workshopId}`)[0].live_step_id).toBe(world.stepIds[0]);
	// Ending from the presenter window: the projector publishes the end and leaves for the workshop's page.
	await presenter.getByRole('button', { name: 'End live session' }).click();
	await expect(presenter.getByTestId('presenter-ended')).toBeVisible();
	await expect(page).toHaveURL(new RegExp(`/workshops/${world.workshopId}$`));
	await expect.poll(async () => (await sql`select live_step_id from workshops where id = ${world.workshopId}`)[0].live_step_id).toBeNull();
	await presenter.close();
});

test('keeps a what-if as a new revision of the step’s setup, with a note, and the lesson keeps its pin', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const world = await makeLiveWorld(sql, page.request, 'Keep test workshop');
	const [{ latest }] = await sql`select latest_revision as latest from setups where id = ${world.setupId}`;
	await page.goto(`/workshops/${world.workshopId}/present/${world.lessonId}`);
	await expect(page.getByTestId('present-caption')).toHaveText(CAPTIONS[0]);
	await page.getByRole('button', { name: 'A third of a stop more power' }).click();
	await page.getByRole('button', { name: 'Keep as a new revision…' }).click();
	await page.getByLabel('Note for the revision').fill('Key a third of a stop up, shown in the workshop');
	await page.getByRole('button', { name: 'Keep as a new revision', exact: true }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Kept as revision' })).toContainText(`Kept as revision ${latest + 1}`);
	const [saved] = await sql`select message, document from setup_revisions where setup_id = ${world.setupId} and number = ${latest + 1}`;
	expect(saved.message).toBe('Key a third of a stop up, shown in the workshop');
	// The whole revision is kept (the card and the flag the step hid are still there), with the key's new power.
	const lights = (saved.document.scene.lights as { id: string; power?: number }[]).map((l) => l.id).sort();
	expect(lights).toEqual(['card', 'key']);
	expect(saved.document.scene.flags.map((f: { id: string }) => f.id)).toEqual(['flag']);
	expect(saved.document.scene.lights.find((l: { id: string }) => l.id === 'key').power).toBeCloseTo(0.25 * 2 ** (1 / 3), 6);
	const pins = await sql`select distinct revision_number from workshop_steps where lesson_id = ${world.lessonId}`;
	expect(pins.map((p) => p.revision_number)).toEqual([latest]);
});
