// The API reference at /api: read from the OpenAPI document, every route with its fields, at phone
// width in dark mode without running off the side (the fixture fails any request off this machine).
import { expect, test } from './fixtures';

test('the API reference lists the routes with their fields, at phone width in dark mode', async ({ page }) => {
	await page.setViewportSize({ width: 390, height: 844 });
	await page.emulateMedia({ colorScheme: 'dark' });
	await page.addInitScript(() => document.documentElement.classList.add('dark'));
	await page.goto('/api');
	await expect(page.getByRole('heading', { level: 1, name: 'Squarelaw API' })).toBeVisible();
	await expect(page.locator('html')).toHaveClass(/dark/);

	const openapi = await (await page.request.get('/api/v1/openapi.json')).json();
	const operations = Object.values(openapi.paths as Record<string, object>).reduce((n: number, ops) => n + Object.keys(ops).length, 0);
	await expect(page.getByTestId('api-operation')).toHaveCount(operations);

	// The routes list leads to a route; its body lists the fields with their limits.
	await page.getByRole('navigation', { name: 'Routes' }).getByRole('link', { name: '/api/v1/calc/flash' }).click();
	const flash = page.locator('#post-api-v1-calc-flash');
	await expect(flash).toContainText('guideNumber');
	const power = flash.locator('tr').filter({ has: page.locator('code', { hasText: /^power$/ }) }).first();
	await expect(power).toContainText('> 0, ≤ 1');

	// A long body starts folded and opens.
	const save = page.locator('#put-api-v1-setups-id');
	const body = save.locator('details', { hasText: 'Request body' });
	await expect(body.getByText('document.scene.lights[].guideNumber').first()).toBeHidden();
	await body.locator('summary').click();
	await expect(body.getByText('document.scene.lights[].guideNumber').first()).toBeVisible();

	expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
});
