// Workshops in a real browser: the club's owner builds a workshop with a lesson of three steps from the
// seeded quartz setup (the key alone, key and card, key, card and flag), reorders them by keyboard and
// by dragging, publishes it, invites a student by e-mail (one bad address in the list is named); the
// student joins by the link and reads the lesson without the presenter's notes, each step drawn
// read-only; the lesson's handout prints one PDF page per step.
import { randomUUID } from 'node:crypto';
import type { Page } from '@playwright/test';
import { expect, signIn, signedInAs, test, waitForMail, firstLink } from './fixtures';

const OWNER = 'mara.quill@fernhill.example';
const QUARTZ = 'Quartz cluster on black velvet';
const tag = () => randomUUID().slice(0, 8);

/** Opens a page and waits until its scripts have loaded, so a click is never undone by hydration. */
async function visit(page: Page, url: string) {
	await page.goto(url);
	await page.waitForLoadState('networkidle');
}

/** Pages in a PDF as Chromium writes it: one `/Type /Page` object per page (the tree's node is `/Pages`). */
function pdfPageCount(pdf: Buffer): number {
	return (pdf.toString('latin1').match(/\/Type\s*\/Page(?![s\w])/g) ?? []).length;
}

/** The pixel width of every image object in a PDF as Chromium writes it (`/Subtype /Image … /Width n`). */
function pdfImageWidths(pdf: Buffer): number[] {
	const dicts = pdf.toString('latin1').match(/<<[^>]*\/Subtype\s*\/Image[^>]*>>/g) ?? [];
	return dicts.map((d) => Number(/\/Width\s+(\d+)/.exec(d)?.[1] ?? 0));
}

const CAPTIONS = ['The key light alone', 'Add the white card', 'Add the black flag'];

test('build a three-step lesson from the quartz setup, invite a student who follows it, print one page per step', async ({ page, context, browser, baseURL }) => {
	test.setTimeout(180_000);
	await signedInAs(context, browser, baseURL, OWNER);
	const title = `Small Light test ${tag()}`;

	// A new workshop in the club's studio.
	await visit(page, '/workshops');
	await page.getByLabel('Studio').selectOption({ label: 'Fernhill Geology Circle' });
	await page.getByLabel('Title').fill(title);
	await page.getByLabel('Capacity').fill('8');
	await page.getByRole('button', { name: 'Create workshop' }).click();
	await expect(page.getByRole('heading', { level: 1, name: title })).toBeVisible();
	await expect(page.getByTestId('workshop-state')).toHaveText('draft');
	const workshopUrl = new URL(page.url()).pathname;
	await page.waitForLoadState('networkidle');

	// A session: an end before the start is refused beside the field; then the real one.
	await page.getByLabel('Starts').fill('2027-02-11T18:30');
	await page.getByLabel('Ends').fill('2027-02-11T17:00');
	await page.getByLabel('Place').fill('Fernhill Community Hall');
	await page.getByRole('button', { name: 'Add session' }).click();
	await expect(page.getByText('The end must come after the start.')).toBeVisible();
	await page.getByLabel('Ends').fill('2027-02-11T21:00');
	await page.getByRole('button', { name: 'Add session' }).click();
	await expect(page.getByTestId('sessions')).toContainText('Fernhill Community Hall');

	// Publish, with a summary.
	await page.getByLabel('Summary (Markdown)').fill('One **small** flash, a card and a flag.');
	await page.getByRole('radio', { name: /^Published/ }).check();
	await page.getByRole('button', { name: 'Save details' }).click();
	await expect(page.getByTestId('workshop-state')).toHaveText('published');
	await expect(page.getByTestId('workshop-summary').locator('strong')).toHaveText('small');

	// A lesson, then three steps pinning the quartz setup's latest revision.
	await page.getByLabel('New lesson').fill('Build the light on the quartz');
	await page.getByRole('button', { name: 'Add lesson' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Build the light on the quartz' })).toBeVisible();
	await page.waitForLoadState('networkidle');
	await page.getByLabel('Notes for students (Markdown)').fill('Watch the ratio when the card goes in.');
	await page.getByLabel('Notes for the presenter only (Markdown)').fill('Dim the hall lights first.');
	await page.getByRole('button', { name: 'Save lesson' }).click();
	await expect(page.getByTestId('presenter-notes')).toContainText('Dim the hall lights first.');

	const quartzOption = page.locator('#setupId option', { hasText: QUARTZ }).first();
	const quartzId = (await quartzOption.getAttribute('value'))!;
	for (const caption of CAPTIONS) {
		await page.locator('#setupId').selectOption(quartzId);
		await page.locator('#caption').fill(caption);
		await page.getByRole('button', { name: 'Add step' }).click();
		await expect(page.getByTestId('step-caption').filter({ hasText: caption })).toBeVisible();
	}
	const steps = page.getByTestId('step');
	await expect(steps).toHaveCount(3);
	await expect(steps.nth(0)).toContainText('revision 5');

	// What each step shows: the key alone, then the key and the card; the third shows everything.
	async function showOnly(index: number, hidden: string[]) {
		const step = steps.nth(index);
		await step.getByText(`Edit step ${index + 1}`).click();
		for (const label of hidden) await step.getByRole('checkbox', { name: label }).uncheck();
		await step.getByRole('button', { name: `Save step ${index + 1}` }).click();
		for (const label of hidden) await expect(step.getByText(/^Shown:/)).not.toContainText(label);
	}
	await showOnly(0, ['White card', 'Black flag off the lens']);
	await showOnly(1, ['Black flag off the lens']);
	await expect(steps.nth(0).getByText(/^Shown:/)).toContainText('Kestrel 40 in softbox');
	await expect(steps.nth(2).getByText(/^Shown:/)).toContainText('Black flag off the lens');
	// The card adds light: the key alone and key + card differ; the flag, off every light path, changes nothing.
	const figures = await steps.getByTestId('step-exposure').allTextContents();
	expect(figures[0]).not.toBe(figures[1]);
	expect(figures[1].replace(/\d+ lights?/, '')).toBe(figures[2].replace(/\d+ lights?/, ''));

	// Reorder: Alt+↓ on the first step's handle moves it down; dragging puts it back.
	const captions = () => page.getByTestId('step-caption').allTextContents();
	await steps.nth(0).getByRole('button', { name: /^Step 1: move/ }).press('Alt+ArrowDown');
	await expect.poll(captions).toEqual([CAPTIONS[1], CAPTIONS[0], CAPTIONS[2]]);
	await expect(page.getByRole('button', { name: /^Step 2: move/ })).toBeFocused();
	await steps.nth(1).dragTo(steps.nth(0));
	await expect.poll(captions).toEqual(CAPTIONS);
	await page.reload();
	await expect.poll(captions).toEqual(CAPTIONS);
	const lessonUrl = new URL(page.url()).pathname;

	// Each step's thumbnail is the editor's drawing, read-only, with no words at that size, and keeps a
	// light-theme image at three times its pixels for paper.
	for (let i = 0; i < 3; i++) {
		const figure = steps.nth(i).getByTestId('plan-figure');
		await figure.scrollIntoViewIfNeeded();
		const plan = figure.getByRole('img', { name: `Plan of step ${i + 1}` });
		await expect(plan.locator('canvas').first()).toBeVisible();
		await expect(plan).toHaveAttribute('data-annotations', '[]');
		await expect(figure.getByRole('application')).toHaveCount(0);
		const printed = figure.getByTestId('plan-figure-image');
		await expect(printed).toHaveAttribute('src', /^blob:/);
		await expect(printed).toBeHidden();
		const ratio = await plan.evaluate((el, img) => (img as HTMLImageElement).naturalWidth / el.clientWidth, await printed.elementHandle());
		expect(ratio).toBeGreaterThanOrEqual(2.9);
	}
	await page.emulateMedia({ media: 'print' });
	await expect(steps.nth(0).getByTestId('plan-figure-image')).toBeVisible();
	await expect(steps.nth(0).locator('[aria-roledescription="plan"]')).toBeHidden();
	// Back to no emulation: a page left emulating "screen" would print its PDF with the screen's styles.
	await page.emulateMedia({ media: null });

	// The lesson's handout: one PDF page per step.
	await visit(page, `${lessonUrl}/handout`);
	await expect(page.getByTestId('handout-page')).toHaveCount(3);
	await expect(page.getByTestId('handout-page').nth(2)).toContainText(CAPTIONS[2]);
	// Each page's plan is drawn once into an image (on screen and on paper), as sharp as a 3× render.
	const images = page.getByTestId('handout-page').getByTestId('plan-figure-image');
	await expect(images).toHaveCount(3);
	for (let i = 0; i < 3; i++) {
		await expect(images.nth(i)).toHaveAccessibleName(`Plan of step ${i + 1}, seen from above`);
		await expect.poll(() => images.nth(i).evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth / img.clientWidth)).toBeGreaterThanOrEqual(2.5);
	}
	const pdf = await page.pdf({ format: 'A4', printBackground: false });
	expect(pdfPageCount(pdf)).toBe(3);
	// The PDF holds the three plans as images, at more pixels than the box each prints in (read from the
	// image objects' own dictionaries: the PDF reader's image extraction needs a newer Node than ours).
	const imageWidths = pdfImageWidths(pdf);
	expect(imageWidths.filter((w) => w > 1000).length, `image widths ${imageWidths.join(', ')}`).toBeGreaterThanOrEqual(3);

	// Without JavaScript the lesson lists each step's plan in words: what it shows, nothing hidden.
	const noJs = await browser.newContext({ baseURL, javaScriptEnabled: false });
	await noJs.addCookies(await context.cookies());
	const plain = await noJs.newPage();
	await plain.goto(lessonUrl);
	const fallbacks = plain.getByTestId('plan-fallback');
	await expect(fallbacks).toHaveCount(3);
	await expect(fallbacks.nth(0)).toContainText('Kestrel 40 in softbox');
	await expect(fallbacks.nth(0)).toContainText('from the subject');
	await expect(fallbacks.nth(0)).not.toContainText('White card');
	await expect(fallbacks.nth(2)).toContainText('Black flag off the lens');
	await noJs.close();

	// Invite a student (one bad address in the list is named, the good one goes out).
	const student = `student.${tag()}@fernhill.example`;
	await visit(page, `${workshopUrl}/roster`);
	await page.getByLabel('Addresses').fill(`${student}\nnot-an-address`);
	await page.getByRole('button', { name: 'Send invitations' }).click();
	await expect(page.getByTestId('invite-report')).toContainText(`Invited 1: ${student}`);
	await expect(page.getByTestId('invite-report')).toContainText('“not-an-address”');
	await expect(page.getByTestId('open-invitations')).toContainText(student);

	// The student signs in in a browser of their own, joins by the link, and follows the lesson.
	const studentContext = await browser.newContext({ baseURL });
	const s = await studentContext.newPage();
	await signIn(s, student, '/workshops');
	await expect(s.getByRole('heading', { level: 1, name: 'Workshops' })).toBeVisible();
	const invitation = await waitForMail(s, student, /Invitation to the workshop/);
	await s.goto(firstLink(invitation.text));
	await s.getByRole('button', { name: 'Join the workshop' }).click();
	await expect(s.getByRole('heading', { level: 1, name: title })).toBeVisible();
	await expect(s.getByRole('link', { name: 'Roster and invitations' })).toHaveCount(0);
	await s.getByRole('link', { name: 'Build the light on the quartz' }).click();
	await expect(s.getByTestId('student-notes')).toContainText('Watch the ratio');
	await expect(s.getByText('Dim the hall lights first.')).toHaveCount(0);
	await expect(s.getByTestId('presenter-notes')).toHaveCount(0);
	await expect(s.getByRole('button', { name: /^Save step/ })).toHaveCount(0);
	await s.getByRole('link', { name: 'Open the first step' }).click();
	await expect(s.getByRole('heading', { level: 1, name: 'Step 1 of 3' })).toBeVisible();
	await expect(s.getByTestId('step-caption')).toHaveText(CAPTIONS[0]);
	await expect(s.getByTestId('plan-canvas').locator('canvas').first()).toBeVisible();
	await expect(s.getByText(/not shown in this step: White card, Black flag off the lens/)).toBeVisible();
	await s.getByRole('link', { name: 'Step 2 →' }).click();
	await expect(s.getByRole('heading', { level: 1, name: 'Step 2 of 3' })).toBeVisible();
	await expect(s.getByTestId('step-caption')).toHaveText(CAPTIONS[1]);
	// The setup itself stays out of sight: only what the lesson pins, through the workshop.
	expect((await s.request.get(`/api/v1/setups/${quartzId}`)).status()).toBe(404);
	await studentContext.close();

	// The roster shows the student; the public page counts the seat.
	await visit(page, `${workshopUrl}/roster`);
	await expect(page.getByRole('table', { name: 'Students' })).toContainText(student);
	await expect(page.getByTestId('seats')).toContainText('1 of 8 seats taken');
	await visit(page, workshopUrl);
	await page.getByRole('link', { name: 'Public page' }).click();
	await expect(page.getByTestId('seats-left')).toContainText('7 of 8');
});
