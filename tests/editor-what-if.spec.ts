// The plan editor's what-if control and its shortcut sheet, in a real browser against the real app: a
// trial distance shows the change in stops at once and moves nothing until kept; Keep is one undo step,
// Drop forgets; "?" and the toolbar button open the shortcut sheet, Escape closes it and focus returns.
import { createQuartzSetup, expect, signedInAs, test } from './fixtures';

const OWNER = 'mara.quill@fernhill.example';

test('what-if: twice as far is −2 stops at once, nothing moves until Keep, Keep is one undo step, Drop forgets', async ({
	page,
	context,
	browser,
	baseURL
}) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const id = await createQuartzSetup(page, 'What-if test');
	await page.goto(`/setups/${id}`);
	await page.waitForLoadState('networkidle');
	await expect(page.getByTestId('plan-canvas').locator('canvas').first()).toBeVisible();

	const flashRow = page.getByTestId('element-list').getByRole('button', { name: /, Flash, at / });
	await flashRow.click();
	const whatIf = page.getByTestId('what-if');
	await expect(whatIf).toBeVisible();
	const undo = page.getByRole('button', { name: 'Undo' });
	await expect(undo).toBeDisabled();

	// Guide-number exposure X = (GN·√power / (d·N_w))² (/api/v1/openapi.json): GN 40 at 1/8 from 30 cm at f/16 × 1.5.
	const stops = (dM: number) => Math.log2(((40 * Math.sqrt(1 / 8)) / (dM * 24)) ** 2);
	const fmt = (s: number) => `${s > 0 ? '+' : '−'}${Math.abs(s).toFixed(1)}`;
	await whatIf.getByLabel('Distance to the subject').fill('6');
	await expect(whatIf.getByTestId('what-if-distance')).toHaveText('twice as far: −2.0 stops');
	await expect(whatIf.getByTestId('what-if-result')).toContainText(`${fmt(stops(0.6))} stops (now ${fmt(stops(0.3))} stops)`);
	await expect(whatIf.getByTestId('what-if-summary')).toContainText('Whole exposure −2.0 stops');
	// A trial only: the flash has not moved and there is nothing to undo; the plan marks where it would go.
	await expect(flashRow).toHaveAccessibleName(/at -30 cm, 0 cm/);
	await expect(undo).toBeDisabled();
	const plan = page.getByRole('application', { name: /Plan of the setup/ });
	await expect(plan).toHaveAttribute('data-trial', '-0.600,0.000');

	await whatIf.getByRole('button', { name: 'Keep' }).click();
	await expect(flashRow).toHaveAccessibleName(/at -60 cm, 0 cm/);
	await expect(plan).not.toHaveAttribute('data-trial');
	await expect(whatIf.getByTestId('what-if-distance')).toHaveText('same distance: 0.0 stops');
	await undo.click();
	await expect(flashRow).toHaveAccessibleName(/at -30 cm, 0 cm/);
	await expect(undo).toBeDisabled();

	// A stop more power, dropped: the power stays 1/8.
	await whatIf.getByLabel('Power').fill('3');
	await expect(whatIf.getByTestId('what-if-power')).toHaveText('power +1.0 stop · 1/4');
	await whatIf.getByRole('button', { name: 'Drop' }).click();
	await expect(whatIf.getByTestId('what-if-power')).toHaveText('same power: 0.0 stops · 1/8');
	await expect(page.locator('#prop-power')).toHaveValue('1/8');
	await expect(undo).toBeDisabled();
});

test('the shortcut sheet opens with ? and from the toolbar, closes with Escape and gives the focus back', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const id = await createQuartzSetup(page, 'What-if test');
	await page.goto(`/setups/${id}`);
	await page.waitForLoadState('networkidle');
	const plan = page.getByRole('application', { name: /Plan of the setup/ });
	await expect(page.getByTestId('plan-canvas').locator('canvas').first()).toBeVisible();

	const sheet = page.getByRole('dialog', { name: 'Keyboard shortcuts' });
	await plan.focus();
	await page.keyboard.press('Shift+?');
	await expect(sheet).toBeVisible();
	await expect(sheet.getByRole('row', { name: /Undo: take back the last change/ })).toContainText('Ctrl');
	await expect(sheet.getByRole('row', { name: /Open this list/ })).toBeVisible();
	await expect(sheet.getByRole('row', { name: /Look closer/ }).locator('kbd')).toHaveText(['+']);
	// Only what the screen shows, in our own words: no pointer modes, no drawing order.
	await expect(sheet).not.toContainText(/Select tool|Hand tool|to front|to back/i);
	await expect(sheet.getByRole('row', { name: /Slide the view/ }).locator('kbd')).toHaveText(['Space (hold)']);
	// Modal: the focus is inside the sheet.
	await expect(sheet.getByRole('button', { name: 'Close' })).toBeFocused();
	await page.keyboard.press('Escape');
	await expect(sheet).toBeHidden();
	await expect(plan).toBeFocused();

	const button = page.getByRole('button', { name: 'Shortcuts' });
	await button.click();
	await expect(sheet).toBeVisible();
	await page.keyboard.press('Escape');
	await expect(sheet).toBeHidden();
	await expect(button).toBeFocused();

	// "?" typed into a text field is text, not a shortcut.
	const label = page.getByLabel('Label', { exact: true });
	await page.getByTestId('element-list').getByRole('button', { name: /, Flash, at / }).click();
	await label.fill('');
	await label.pressSequentially('Key?');
	await expect(label).toHaveValue('Key?');
	await expect(sheet).toBeHidden();
});
