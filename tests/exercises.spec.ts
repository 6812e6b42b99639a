// Exercises in a real browser: the club's owner sets an exercise with two targets in the seeded lesson;
// the seeded student starts it, sees the lighting ratio unmet beside the editor, moves the white card
// until it is met, saves, uploads a shot and hands in; the owner opens the hand-in with its targets,
// writes feedback and asks for another try; the student gets the mail and reads the feedback.
import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import type { Page } from '@playwright/test';
import { expect, firstLink, signedInAs, test, waitForMail } from './fixtures';
import { inspectorTab } from './workspace';

const OWNER = 'mara.quill@fernhill.example';
const STUDENT = 'pebble.finch@fernhill.example';
const WORKSHOP = '7b2c4e90-1a3f-4d6b-8e25-6c0f00000001';
const LESSON = '7b2c4e90-1a3f-4d6b-8e25-6c0f00000101';

async function visit(page: Page, url: string) {
	await page.goto(url);
	await page.waitForLoadState('networkidle');
}

test('set an exercise, start it, meet the lighting ratio live, hand in, review, and read the feedback', async ({ page, context, browser, baseURL }) => {
	test.setTimeout(240_000);
	const title = `Faces at 3:1 ${randomUUID().slice(0, 6)}`;

	// The instructor sets the exercise: the seeded quartz setup's fifth revision, two targets.
	await signedInAs(context, browser, baseURL, OWNER);
	await visit(page, `/workshops/${WORKSHOP}/lessons/${LESSON}`);
	await page.getByTestId('exercises').getByRole('link', { name: 'Set an exercise' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Set an exercise' })).toBeVisible();
	await page.waitForLoadState('networkidle');
	const quartz = page.locator('#setupId option', { hasText: 'Quartz cluster on black velvet' }).first();
	await page.locator('#setupId').selectOption((await quartz.getAttribute('value'))!);
	await page.getByLabel('Revision').fill('5');
	await page.getByLabel('Title').fill(title);
	await page.getByLabel('Brief (Markdown)').fill('Bring the card in until the key is about **3:1** over the fill.');
	await page.getByLabel('Due').fill('2030-06-01T21:00');
	// An inverted range is named beside its field and nothing is lost.
	await page.getByRole('checkbox', { name: 'Lighting ratio (key to the next light)' }).check();
	await page.locator('#target-lightingRatio-min').fill('4');
	await page.locator('#target-lightingRatio-max').fill('2.5');
	await page.getByRole('checkbox', { name: 'Number of lights (flashes and continuous)' }).check();
	await page.locator('#target-lightCount-max').fill('2');
	await page.getByRole('button', { name: 'Set the exercise' }).click();
	await expect(page.locator('#target-lightingRatio-max-error')).toContainText('the range is inverted');
	await expect(page.getByLabel('Title')).toHaveValue(title);
	await page.locator('#target-lightingRatio-min').fill('2.5');
	await page.locator('#target-lightingRatio-max').fill('4');
	await page.getByRole('button', { name: 'Set the exercise' }).click();
	await expect(page.getByRole('heading', { level: 1, name: title })).toBeVisible();
	await expect(page.getByTestId('targets')).toContainText('Lighting ratio (key to the next light): 2.5:1 to 4:1');
	const exerciseUrl = new URL(page.url()).pathname;

	// The student starts it: their own copy opens in the editor with the brief and the targets beside it.
	const studentContext = await browser.newContext({ baseURL });
	const student = await studentContext.newPage();
	await signedInAs(studentContext, browser, baseURL, STUDENT);
	await visit(student, exerciseUrl);
	await student.getByRole('button', { name: 'Start the exercise' }).click();
	await expect(student).toHaveURL(/\/setups\/[0-9a-f-]{36}\?started/);
	await student.waitForLoadState('networkidle');
	const panel = student.getByTestId('brief-panel');
	await expect(panel.getByTestId('brief').locator('strong')).toHaveText('3:1');
	const ratio = panel.getByTestId('live-targets').locator('[data-kind="lightingRatio"]');
	await expect(ratio).toHaveAttribute('data-met', 'false');
	await expect(ratio).toContainText(/:1: not met, [0-9.]+ above the range/);
	await expect(panel.locator('[data-kind="lightCount"]')).toHaveAttribute('data-met', 'true');
	await expect(panel.getByTestId('target-tally')).toContainText('1 of 2 met');

	// Move the white card toward the subject a step at a time until the ratio is met on the canvas, then save.
	await student.getByTestId('element-list').getByRole('button', { name: /^White card, / }).click();
	for (const x of ['12 cm', '10 cm', '8 cm', '6 cm']) {
		await student.locator('#move-x').fill(x);
		await student.getByRole('button', { name: 'Move', exact: true }).click();
		await expect(student.getByTestId('element-list').getByRole('button', { name: new RegExp(`^White card, .* at ${x}`) })).toBeVisible();
		if ((await ratio.getAttribute('data-met')) === 'true') break;
	}
	await expect(ratio).toHaveAttribute('data-met', 'true');
	await expect(panel.getByTestId('target-tally')).toContainText('2 of 2 met on the canvas (not saved yet)');
	await inspectorTab(student, 'Save');
	await student.getByLabel('What changed (optional)').fill('Card in closer');
	await student.getByRole('button', { name: 'Save revision' }).click();
	await expect(student.getByText('Saved as revision 2.')).toBeVisible();

	// A test frame, uploaded against the copy.
	const exif = { IFD0: { Model: 'Fernhill Test Camera' }, IFD2: { FNumber: '16/1', ExposureTime: '1/200', ISOSpeedRatings: '200' } };
	const frame = await sharp({ create: { width: 600, height: 400, channels: 3, background: { r: 118, g: 118, b: 118 } } }).jpeg().withExif(exif).toBuffer();
	await student.getByTestId('shots-picker').setInputFiles([{ name: 'quartz-test.jpg', mimeType: 'image/jpeg', buffer: frame }]);
	await expect(student.getByTestId('upload').filter({ hasText: 'quartz-test.jpg' })).toContainText('Stored');

	// Hand in revision 2 with the shot and a note.
	await visit(student, exerciseUrl);
	await expect(student.getByLabel('Revision', { exact: true })).toHaveValue('2');
	await expect(student.getByRole('checkbox', { name: /quartz-test\.jpg/ })).toBeChecked();
	await student.getByLabel('Note for your instructor (Markdown)').fill('Moved the card 5 cm in.');
	await student.getByRole('button', { name: 'Hand in' }).click();
	await expect(student.getByTestId('handed-in')).toContainText('Handed in as version 1');

	// The instructor's table, then the hand-in with its targets, plans and shot; feedback and another try.
	await visit(page, exerciseUrl);
	const row = page.getByTestId('hand-in-table').getByRole('row', { name: /Pebble Finch/ });
	await expect(row).toContainText('2 of 2');
	await expect(row).toContainText('Waiting for review');
	await row.getByRole('link', { name: 'Pebble Finch' }).click();
	await page.waitForLoadState('networkidle');
	await expect(page.getByTestId('hand-in-targets').locator('[data-met="true"]')).toHaveCount(2);
	// Both plans drawn by the plan's own stage, each a picture named for what it shows.
	await expect(page.getByTestId('plans-side-by-side').getByTestId('plan-figure')).toHaveCount(2);
	for (const name of ['The starting plan', 'The handed-in plan']) await expect(page.getByTestId('plans-side-by-side').getByRole('img', { name }).locator('canvas').first()).toBeVisible();
	await expect(page.getByTestId('comparison')).toContainText(/card/i);
	await expect(page.getByTestId('hand-in-shots')).toContainText('quartz-test.jpg');
	const shotImage = page.getByTestId('hand-in-shots').locator('img').first();
	await expect.poll(() => shotImage.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).toBe(true);
	const sentAt = Date.now();
	await page.getByLabel('Feedback (Markdown)').fill('The ratio is right; now **feather** the key off the velvet.');
	await page.getByRole('radio', { name: 'Another try' }).check();
	await page.getByRole('button', { name: /^Save the review/ }).click();
	await expect(page.getByRole('status').filter({ hasText: 'has been told by e-mail' })).toBeVisible();

	// The student is told and reads it.
	const mail = await waitForMail(student, STUDENT, /another try/, sentAt - 1000);
	await visit(student, new URL(firstLink(mail.text)).pathname);
	await expect(student.getByTestId('hand-in-state')).toHaveText('Another try');
	await expect(student.getByTestId('feedback-text').locator('strong')).toHaveText('feather');

	// At phone width nothing runs off the side; printed, the page drops its navigation.
	await student.setViewportSize({ width: 390, height: 844 });
	await expect.poll(() => student.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
	await student.emulateMedia({ media: 'print' });
	await expect(student.getByRole('navigation', { name: 'Breadcrumb' })).toBeHidden();
	await expect(student.getByTestId('feedback-text')).toBeVisible();
	await studentContext.close();
});
