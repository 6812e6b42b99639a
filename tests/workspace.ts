import { expect, type Page } from '@playwright/test';

/** Opens one of the editor inspector's tabs (Element, Camera, Exposure, Save) and waits for its panel. */
export async function inspectorTab(page: Page, name: 'Element' | 'Camera' | 'Exposure' | 'Save') {
	const tab = page.getByRole('tablist', { name: 'Inspector' }).getByRole('tab', { name, exact: true });
	await tab.click();
	await expect(tab).toHaveAttribute('aria-selected', 'true');
}
