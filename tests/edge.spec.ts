// Text the database cannot store, typed into a page in a real browser: the form action's failure comes
// from the request edge (src/lib/server/edge.ts) and the page shows it beside the field, as it shows any
// other failure; nothing is saved and what was typed stays in the field.
import { createQuartzSetup, expect, signedInAs, test } from './fixtures';

const OWNER = 'mara.quill@fernhill.example';

test('notes holding a NUL character: the message beside the notes, nothing saved, the text kept', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const id = await createQuartzSetup(page, 'Edge test');
	await page.goto(`/setups/${id}`);
	await page.waitForLoadState('networkidle');

	await page.getByText('Write notes').click();
	const notes = page.getByLabel(/^Notes \(Markdown/);
	await notes.fill('Velvet\u0000 under the base');
	await page.getByRole('button', { name: 'Save notes' }).click();

	await expect(page.locator('#notes-error')).toContainText('must not contain the NUL character (U+0000)');
	await expect(notes).toHaveAttribute('aria-invalid', 'true');
	await expect(notes).toHaveValue('Velvet\u0000 under the base');
	const revisions = await (await page.request.get(`/api/v1/setups/${id}/revisions`)).json();
	expect(revisions).toHaveLength(1);
});
