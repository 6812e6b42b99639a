// The calculator at /calc: the flash power for f/16 at 1:1, read with its working, live with JavaScript,
// through the form action without it, and in imperial units remembered across visits.
import { randomUUID } from 'node:crypto';
import { expect, signIn, test } from './fixtures';

const FLASH = 'Flash power for an aperture';

test.describe('calculator with JavaScript', () => {
	test('finds the flash power for f/16 at 1:1 and shows the working', async ({ page }) => {
		await page.goto('/calc');
		const card = page.getByRole('region', { name: FLASH });
		await card.getByLabel('Guide number').fill('32 m');
		await card.getByLabel('Flash to subject').fill('30 cm');
		await card.getByLabel('Aperture (marked)').fill('f/16');
		await card.getByLabel('ISO', { exact: true }).fill('100');
		await card.getByLabel('Losses (stops)').fill('0');
		await card.getByLabel('Magnification', { exact: true }).fill('1:1');

		// GN 32 m, f/16 at 1:1 works at f/32; 0.3 m × 32 = GN 9.6 needed; (9.6 / 32)² = 0.09 of full power,
		// whose nearest third-stop step is 1/16 + 2/3 (0.0992).
		const answer = card.getByTestId('flash-answer');
		await expect(answer.getByTestId('flash-headline')).toHaveText('Set the flash to 1/16 +0.7 power');
		const working = answer.getByTestId('flash-working');
		await expect(working).toContainText('16 × (1 + 1 / 1) = f/32');
		await expect(working).toContainText('0.3 m × 32 = 9.6 (m)');
		await expect(working).toContainText('(9.6 ÷ 32)² = 0.09 of full power');
		await expect(working).toContainText('1/16 +0.7 (0.0992 of full power)');
		await expect(answer).toContainText('Exact power');

		// Typing a new distance with its own unit updates the answer live (debounced).
		await card.getByLabel('Flash to subject').fill('1 ft');
		await expect(working).toContainText('0.305 m × 32 = 9.75 (m)');

		// A bad field is named beside it, and the answer waits for a fix.
		await card.getByLabel('Flash to subject').fill('banana');
		await expect(card.getByText('Flash to subject “banana” is not a unit')).toBeVisible();
	});

	test('a living subject at close range gets the flash caution', async ({ page }) => {
		await page.goto('/calc');
		const card = page.getByRole('region', { name: FLASH });
		await card.getByLabel('Flash to subject').fill('20 cm');
		await card.getByLabel('The subject is a person or an animal').check();
		await expect(card.locator('.caution-box')).toContainText('eyes of people and animals');
	});

	test('imperial units are shown and remembered', async ({ page }) => {
		await page.goto('/calc');
		await page.getByRole('button', { name: 'Imperial (in, ft)' }).click();
		const card = page.getByRole('region', { name: FLASH });
		await expect(card.getByLabel('Guide number')).toHaveValue('105 ft');
		await expect(card.getByLabel('Flash to subject')).toHaveValue('12 in');
		await expect(card.getByTestId('flash-working')).toContainText('(ft)');
		await page.reload();
		await expect(page.getByRole('button', { name: 'Imperial (in, ft)' })).toHaveAttribute('aria-pressed', 'true');
		await expect(page.getByRole('region', { name: FLASH }).getByLabel('Flash to subject')).toHaveValue('12 in');
		await page.getByRole('button', { name: 'Metric (cm, m)' }).click();
		await expect(page.getByRole('region', { name: FLASH }).getByLabel('Flash to subject')).toHaveValue('30 cm');
	});

	test('a signed-in photographer switches the calculator to imperial; the account stays metric, and the page says so', async ({ page }) => {
		await signIn(page, `imogen.reed+${randomUUID().slice(0, 8)}@fernhill.example`, '/calc');
		await expect(page.getByTestId('units-scope')).toContainText('The calculator only');
		await page.getByRole('button', { name: 'Imperial (in, ft)' }).click();
		await expect(page.getByRole('region', { name: FLASH }).getByLabel('Flash to subject')).toHaveValue('12 in');
		await expect(page.getByTestId('units-scope')).toHaveText(/This page shows imperial units; your account stays metric\./);
		await page.goto('/account');
		await expect(page.getByRole('radio', { name: 'Metric (cm, m)' })).toBeChecked();
		// And back on the calculator, its own choice is kept.
		await page.goto('/calc');
		await expect(page.getByRole('button', { name: 'Imperial (in, ft)' })).toHaveAttribute('aria-pressed', 'true');
	});
});

test.describe('calculator without JavaScript', () => {
	test.use({ javaScriptEnabled: false });

	test('the form action answers the same question with its working', async ({ page }) => {
		await page.goto('/calc');
		const card = page.getByRole('region', { name: FLASH });
		await card.getByLabel('Guide number').fill('32');
		await card.getByLabel('Flash to subject').fill('30');
		await card.getByLabel('Aperture (marked)').fill('16');
		await card.getByLabel('Magnification', { exact: true }).fill('1:1');
		await card.getByRole('button', { name: 'Work it out' }).click();
		await page.waitForURL(/\/calc/);
		const answer = page.getByRole('region', { name: FLASH }).getByTestId('flash-answer');
		await expect(answer.getByTestId('flash-headline')).toHaveText('Set the flash to 1/16 +0.7 power');
		await expect(answer.getByTestId('flash-working')).toContainText('(9.6 ÷ 32)² = 0.09 of full power');
	});

	test('a bad field comes back named, with what was typed kept', async ({ page }) => {
		await page.goto('/calc');
		const card = page.getByRole('region', { name: FLASH });
		await card.getByLabel('Flash to subject').fill('-30 cm');
		await card.getByRole('button', { name: 'Work it out' }).click();
		const again = page.getByRole('region', { name: FLASH });
		await expect(again.getByLabel('Flash to subject')).toHaveValue('-30 cm');
		await expect(again.getByText(/Flash to subject must be at least 0.001 m/)).toBeVisible();
	});
});
