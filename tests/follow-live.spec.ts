// Following live in a real browser: an invited student, in a second browser context at phone width,
// follows the instructor's steps as the instructor presents, without reloading; looks around and
// rejoins on the current step; the instructor ends the session and the student is told.
import { expect, signedInAs, signIn, test } from './fixtures';
import { accessibilityProblems, CAPTIONS, enrol, makeLiveWorld, openDb } from './live-world';

const sql = openDb();
import { randomUUID } from 'node:crypto';

const OWNER = 'mara.quill@fernhill.example';

test.afterAll(async () => {
	await sql.end({ timeout: 5 });
});

test('a student follows the instructor live, looks around, rejoins, and is told when the session ends', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const world = await makeLiveWorld(sql, page.request, 'Follow test workshop');

	// The student: a new address signed in through the mail flow, then enrolled in the workshop.
	const studentEmail = `student+${randomUUID().slice(0, 8)}@fernhill.example`;
	const studentContext = await browser.newContext({ baseURL, viewport: { width: 390, height: 844 } });
	const student = await studentContext.newPage();
	await signIn(student, studentEmail, '/');
	await enrol(sql, world.workshopId, studentEmail);
	await student.goto(`/workshops/${world.workshopId}/follow`);
	await expect(student.getByTestId('follow-status')).toHaveText(/not presenting|Live/);
	// Marks this page load: a reload would lose it.
	await student.evaluate(() => ((window as unknown as { loadedOnce: boolean }).loadedOnce = true));

	// The instructor starts presenting: the student lands on the first step.
	await page.goto(`/workshops/${world.workshopId}/present/${world.lessonId}`);
	await expect(page.getByTestId('present-caption')).toHaveText(CAPTIONS[0]);
	const shown = student.getByTestId('follow-caption');
	await expect(shown).toHaveText(CAPTIONS[0]);
	await expect(student.getByTestId('follow-status')).toHaveText('Live');
	await page.keyboard.press('ArrowRight');
	await expect(shown).toHaveText(CAPTIONS[1]);
	await expect(student.getByTestId('present-offset')).toBeVisible();
	expect(await accessibilityProblems(student)).toEqual([]);

	// The student looks around (the first step), the instructor moves on: the student stays, told where the instructor is.
	await student.getByRole('button', { name: new RegExp(`^1\\. ${CAPTIONS[0]}`) }).click();
	await expect(shown).toHaveText(CAPTIONS[0]);
	await expect(student.getByTestId('follow-toggle')).toHaveAttribute('aria-pressed', 'false');
	await page.keyboard.press('ArrowRight');
	await expect(student.getByTestId('follow-away')).toContainText('step 3');
	await expect(shown).toHaveText(CAPTIONS[0]);
	// Rejoining lands on the instructor's current step.
	await student.getByTestId('follow-toggle').click();
	await expect(shown).toHaveText(CAPTIONS[2]);
	await page.keyboard.press('Home');
	await expect(shown).toHaveText(CAPTIONS[0]);
	expect(await student.evaluate(() => (window as unknown as { loadedOnce?: boolean }).loadedOnce)).toBe(true);
	// Phone width: nothing wider than the screen.
	const overflow = await student.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
	expect(overflow).toBeLessThanOrEqual(0);

	// The instructor ends the live session: back on the workshop's page, and the student is told, still without a reload.
	await page.getByTestId('present-end').click();
	await expect(page).toHaveURL(new RegExp(`/workshops/${world.workshopId}$`));
	await expect(student.getByTestId('follow-status')).toHaveText('Connected; the instructor is not presenting now');
	await expect(student.getByTestId('follow-view')).toHaveAttribute('data-live-step', '');
	expect(await student.evaluate(() => (window as unknown as { loadedOnce?: boolean }).loadedOnce)).toBe(true);
	await studentContext.close();
});

test('someone who is not in the workshop cannot follow it', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const world = await makeLiveWorld(sql, page.request, 'Closed workshop');
	const strangerContext = await browser.newContext({ baseURL });
	const stranger = await strangerContext.newPage();
	await signIn(stranger, `stranger+${randomUUID().slice(0, 8)}@fernhill.example`, '/');
	const res = await stranger.goto(`/workshops/${world.workshopId}/follow`);
	expect(res?.status()).toBe(404);
	const events = await stranger.request.get(`/workshops/${world.workshopId}/follow/events`);
	expect(events.status()).toBe(404);
	await strangerContext.close();
});
