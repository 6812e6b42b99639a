// The account page as a person uses it: a read-only token with an expiry, what a script can do with it,
// its last use on the page; then "Sign out everywhere" ending the sessions of two browsers.
import { randomUUID } from 'node:crypto';
import { expect, signIn, test } from './fixtures';

const address = (name: string) => `${name}+${randomUUID().slice(0, 8)}@fernhill.example`;

test('make a read-only token that expires in 7 days, use it from a script, and see its last use', async ({ page, baseURL }) => {
	await signIn(page, address('mara.quill'), '/account');
	await expect(page.getByRole('heading', { name: 'Your account' })).toBeVisible();

	await page.getByLabel('Token name').fill('catalogue reader');
	await page.getByLabel('Read only').check();
	await page.getByLabel('Expires').selectOption('7');
	await page.getByRole('button', { name: 'Make a token' }).click();
	const notice = page.getByRole('status').filter({ hasText: 'catalogue reader' });
	await expect(notice).toContainText('New read-only token');
	// Dates read as the page writes them once live: in the browser's own zone, as "9 Dec 2026".
	const expires = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' }).format(new Date(Date.now() + 7 * 24 * 3600_000));
	const secret = (await page.getByTestId('new-token').textContent())!.trim();
	expect(secret).toMatch(/^slw_/);

	const row = page.getByRole('row').filter({ hasText: 'catalogue reader' });
	await expect(row).toContainText('read only');
	await expect(row).toContainText(expires);
	await expect(row.getByRole('cell').nth(5)).toHaveText('never');

	// A script: reading works, writing is refused, and pages do not take the token at all.
	const headers = { authorization: `Bearer ${secret}` };
	expect((await page.request.fetch(`${baseURL}/api/v1/setups`, { headers })).status()).toBe(200);
	const write = await page.request.fetch(`${baseURL}/api/v1/setups`, { method: 'POST', headers, data: {} });
	expect(write.status()).toBe(403);
	expect((await write.json()).error.message).toMatch(/read-only/);

	await page.reload();
	await expect(row.getByRole('cell').nth(5)).not.toHaveText('never');
});

test('sign out everywhere ends the sessions of every browser and lands on a signed-out page', async ({ page, newPage }) => {
	const email = address('tobias.wren');
	await signIn(page, email, '/account');
	const other = await newPage();
	await signIn(other, email, '/account');
	await expect(other.getByText(`Signed in as ${email}`)).toBeVisible();

	await page.goto('/account');
	await page.getByRole('button', { name: 'Sign out everywhere' }).click();
	await expect(page).toHaveURL(/\/signed-out$/);
	await expect(page.getByRole('heading', { name: 'You are signed out everywhere' })).toBeVisible();

	for (const p of [page, other]) {
		await p.goto('/account');
		await expect(p).toHaveURL(/\/signin\?callbackUrl=%2Faccount/);
	}
});
