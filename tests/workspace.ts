import { expect, type Page } from '@playwright/test';

/** Opens one of the editor inspector's tabs (Element, Camera, Exposure, Save; a reader's Elements) and waits for its panel. */
export async function inspectorTab(page: Page, name: 'Element' | 'Elements' | 'Camera' | 'Exposure' | 'Save') {
	const tab = page.getByRole('tablist', { name: 'Inspector' }).getByRole('tab', { name, exact: true });
	await tab.click();
	await expect(tab).toHaveAttribute('aria-selected', 'true');
}
