// The foundation in a real browser: sign-in by e-mail link, studios, invitations and roles, the refusals
// that must change nothing, and the phone width.
import postgres from 'postgres';
import { randomUUID } from 'node:crypto';
import { expect, firstLink, requestSignInLink, signIn, test, waitForMail } from './fixtures';
import type { Page } from '@playwright/test';

const databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl) throw new Error('DATABASE_URL is not set: run the browser tests through `npm test`.');
const sql = postgres(databaseUrl, { max: 2, onnotice: () => {} });
test.afterAll(async () => {
	await sql.end({ timeout: 5 });
});

const tag = () => randomUUID().slice(0, 8);
const address = (name: string) => `${name}+${tag()}@fernhill.example`;

/** Makes a shared studio from the Studios page and returns its id; the page ends on the studio. */
async function makeStudio(page: Page, name: string): Promise<string> {
	await page.goto('/studios');
	await page.getByRole('textbox', { name: 'Name' }).fill(name);
	await page.getByRole('button', { name: 'Make the studio' }).click();
	await expect(page.getByRole('heading', { level: 1, name })).toBeVisible();
	const id = new URL(page.url()).pathname.split('/').pop()!;
	expect(id).toMatch(/^[0-9a-f-]{36}$/);
	return id;
}

async function invite(page: Page, email: string, role: 'owner' | 'editor' | 'viewer') {
	await page.getByLabel('E-mail address').fill(email);
	await page.getByLabel('Role', { exact: true }).selectOption(role);
	await page.getByRole('button', { name: 'Send invitation' }).click();
	await expect(page.getByRole('status')).toHaveText(`Invitation sent to ${email}.`);
}

async function expectSignedOut(page: Page) {
	await page.goto('/account');
	await expect(page).toHaveURL(/\/signin\?callbackUrl=%2Faccount/);
	await expect(page.getByRole('link', { name: 'Account' })).toHaveCount(0);
}

test('an owner invites a viewer by e-mail; the viewer sees no edit controls and every change is refused with 403', async ({
	page,
	newPage,
	baseURL
}) => {
	const ownerEmail = address('mara.quill');
	const viewerEmail = address('pebble.finch');
	const studioName = `Fernhill Geology Circle ${tag()}`;

	await signIn(page, ownerEmail);
	await expect(page).toHaveURL(/\/studios$/);
	// A new account comes with a personal studio.
	await expect(page.getByRole('list', { name: 'Your studios' }).getByText('Personal · you are owner')).toBeVisible();
	const studioId = await makeStudio(page, studioName);
	await expect(page.getByTestId('my-role')).toHaveText('owner');
	await expect(page.getByText('You are the only member so far.')).toBeVisible();
	await invite(page, viewerEmail, 'viewer');
	await expect(page.getByText(`${viewerEmail} as viewer, until`)).toBeVisible();

	// The viewer follows the link in the invitation mail, signs in from there and accepts.
	const viewer = await newPage();
	const letter = await waitForMail(viewer, viewerEmail, /Invitation to the studio/);
	expect(letter.subject).toBe(`Invitation to the studio "${studioName}"`);
	const invitationLink = firstLink(letter.text);
	await viewer.goto(invitationLink);
	await expect(viewer.getByText(`You are invited to ${studioName} as viewer.`)).toBeVisible();
	await viewer.getByRole('link', { name: 'Sign in to accept' }).click();
	await expect(viewer.getByLabel('E-mail address')).toHaveValue(viewerEmail);
	const before = Date.now() - 1000;
	await viewer.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(viewer.getByRole('heading', { name: 'Check your mail' })).toBeVisible();
	await viewer.goto(firstLink((await waitForMail(viewer, viewerEmail, /sign-in link/i, before)).text));
	await expect(viewer).toHaveURL(new URL(invitationLink).pathname);
	await expect(viewer.getByText(`Signed in as ${viewerEmail}.`)).toBeVisible();
	await viewer.getByRole('button', { name: 'Accept and join' }).click();
	await expect(viewer).toHaveURL(`/studios/${studioId}`);
	await expect(viewer.getByTestId('my-role')).toHaveText('viewer');

	await test.step('the viewer sees the members but no edit controls', async () => {
		const members = viewer.getByRole('table');
		await expect(members.getByRole('row', { name: new RegExp(ownerEmail.replace(/[+.]/g, '\\$&')) })).toContainText('owner');
		await expect(members.getByRole('row', { name: new RegExp(viewerEmail.replace(/[+.]/g, '\\$&')) })).toContainText('viewer');
		await expect(viewer.getByRole('combobox')).toHaveCount(0);
		await expect(viewer.getByRole('button', { name: /Change|Remove|Send invitation|Rename|Delete studio|Withdraw/ })).toHaveCount(0);
		await expect(viewer.getByRole('heading', { name: /Invite someone|Studio settings/ })).toHaveCount(0);
		await expect(viewer.getByRole('textbox')).toHaveCount(0);
		// What a viewer may do: leave.
		await expect(viewer.getByRole('button', { name: 'Leave this studio' })).toBeVisible();
	});

	await test.step('the server refuses every change the viewer posts (403) and nothing changes', async () => {
		await page.reload();
		await invite(page, address('ines.marlow'), 'editor');
		const invitationId = await page.locator('input[name="invitationId"]').first().inputValue();
		const ownerRow = page.getByRole('row', { name: new RegExp(ownerEmail.replace(/[+.]/g, '\\$&')) });
		const ownerMembershipId = await ownerRow.locator('input[name="membershipId"]').first().inputValue();
		const viewerRow = page.getByRole('row', { name: new RegExp(viewerEmail.replace(/[+.]/g, '\\$&')) });
		const viewerMembershipId = await viewerRow.locator('input[name="membershipId"]').first().inputValue();
		const attempts: [string, Record<string, string>][] = [
			['rename', { name: 'Taken over' }],
			['delete', { confirm: 'delete' }],
			['invite', { email: address('tobias.wren'), role: 'owner' }],
			['revokeInvitation', { invitationId }],
			['changeRole', { membershipId: viewerMembershipId, role: 'owner' }],
			['changeRole', { membershipId: ownerMembershipId, role: 'viewer' }],
			['removeMember', { membershipId: ownerMembershipId }]
		];
		for (const [action, form] of attempts) {
			const res = await viewer.request.post(`/studios/${studioId}?/${action}`, { form, headers: { Origin: baseURL! } });
			expect(res.status(), `${action} ${JSON.stringify(form)}`).toBe(403);
		}
		await page.reload();
		await expect(page.getByRole('heading', { level: 1 })).toHaveText(studioName);
		await expect(ownerRow.getByRole('combobox')).toHaveValue('owner');
		await expect(viewerRow.getByRole('combobox')).toHaveValue('viewer');
		await expect(page.locator('input[name="invitationId"]')).toHaveCount(1);
		const [{ n }] = await sql`select count(*)::int as n from invitations where studio_id = ${studioId}`;
		expect(n).toBe(2);
		await viewer.reload();
		await expect(viewer.getByTestId('my-role')).toHaveText('viewer');
	});

	await test.step('the used invitation link says so and changes nothing', async () => {
		await viewer.goto(invitationLink);
		await expect(viewer.getByRole('alert')).toHaveText('This invitation has already been used. Each invitation works once.');
		await expect(viewer.getByRole('button', { name: 'Accept and join' })).toHaveCount(0);
		const rows = await sql`select role from memberships where studio_id = ${studioId} order by role`;
		expect(rows.map((r) => r.role)).toEqual(['owner', 'viewer']);
	});
});

test('an expired invitation says so, cannot be accepted and leaves the open list', async ({ page, newPage }) => {
	await signIn(page, address('mara.quill'));
	const studioId = await makeStudio(page, `Small Light, Big Detail ${tag()}`);
	const inviteeEmail = address('ines.marlow');
	await invite(page, inviteeEmail, 'editor');
	const link = firstLink((await waitForMail(page, inviteeEmail, /Invitation to the studio/)).text);
	const expired = await sql`
		update invitations set expires_at = now() - interval '1 minute'
		where studio_id = ${studioId} and email = ${inviteeEmail} returning id`;
	expect(expired).toHaveLength(1);

	const invitee = await newPage();
	await invitee.goto(link);
	await expect(invitee.getByRole('alert')).toHaveText('This invitation has expired. Ask the studio owner to send a new one.');
	await expect(invitee.getByRole('link', { name: 'Sign in to accept' })).toHaveCount(0);
	await page.reload();
	await expect(page.getByText('No open invitations.')).toBeVisible();
	const members = await sql`select count(*)::int as n from memberships where studio_id = ${studioId}`;
	expect(members[0].n).toBe(1);
});

test('a malformed e-mail on sign-in gets a clear message and sends nothing', async ({ page }) => {
	await page.goto('/signin?callbackUrl=%2Faccount');
	const field = page.getByLabel('E-mail address');

	// The browser's own check stops an address without an @ before it is sent.
	await field.fill('pebble.finch');
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(page).toHaveURL(/\/signin\?callbackUrl=%2Faccount$/);
	expect(await field.evaluate((el: HTMLInputElement) => el.validity.typeMismatch)).toBe(true);

	// One the browser lets through (no dot in the domain) is refused by the server, with the field named.
	const typed = `pebble.finch+${tag()}@fernhill`;
	await field.fill(typed);
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(page).toHaveURL(/error=InvalidEmail/);
	await expect(page.getByRole('alert')).toHaveText('That is not an e-mail address. It should look like name@example.org.');
	await expect(field).toHaveValue(typed);
	await expect(field).toHaveAttribute('aria-invalid', 'true');
	await expect(page.getByRole('heading', { name: 'Check your mail' })).toHaveCount(0);
	const mail = (await (await page.request.get('/api/dev/mail')).json()) as { to: string }[];
	expect(mail.filter((m) => m.to.includes(typed))).toEqual([]);
	const tokens = await sql`select 1 from verification_tokens where identifier = ${typed}`;
	expect(tokens).toHaveLength(0);

	// Fixing the address then works, and still goes where the person was headed.
	const fixed = `${typed}.example`;
	await field.fill(fixed);
	const before = Date.now() - 1000;
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(page.getByRole('heading', { name: 'Check your mail' })).toBeVisible();
	const link = firstLink((await waitForMail(page, fixed, /sign-in link/i, before)).text);
	expect(new URL(link).searchParams.get('callbackUrl')).toMatch(/\/account$/);
});

test('a sign-in link works once: used again it shows the message and does not sign in', async ({ page, newPage }) => {
	const email = address('tobias.wren');
	const link = await signIn(page, email);
	await expect(page).toHaveURL(/\/studios$/);
	await expect(page.getByRole('link', { name: 'Account' })).toBeVisible();
	// The session cookie is out of reach of scripts and not sent on cross-site requests.
	const session = (await page.context().cookies()).find((c) => c.name.endsWith('authjs.session-token'));
	expect(session).toMatchObject({ httpOnly: true, sameSite: 'Lax' });

	const other = await newPage();
	await other.goto(link);
	await expect(other).toHaveURL(/\/signin\/error\?error=Verification/);
	await expect(other.getByRole('heading', { name: 'That link did not sign you in' })).toBeVisible();
	await expect(other.getByRole('alert')).toHaveText(
		'That sign-in link has expired or has already been used. Each link works once, for 15 minutes.'
	);
	await expectSignedOut(other);
	// The first session is untouched.
	await page.goto('/account');
	await expect(page.getByText(`Signed in as ${email}`)).toBeVisible();
});

test('an expired sign-in link shows the message and does not sign in', async ({ page }) => {
	const email = address('ines.marlow');
	const link = await requestSignInLink(page, email);
	const rows = await sql`
		update verification_tokens set expires = now() - interval '1 minute' where identifier = ${email} returning 1`;
	expect(rows).toHaveLength(1);
	await page.goto(link);
	await expect(page).toHaveURL(/\/signin\/error\?error=Verification/);
	await expect(page.getByRole('alert')).toHaveText(
		'That sign-in link has expired or has already been used. Each link works once, for 15 minutes.'
	);
	await expectSignedOut(page);
	await page.getByLabel('E-mail address').fill(email);
	await expect(page.getByRole('button', { name: 'Send me a sign-in link' })).toBeEnabled();
});

test('the last owner cannot be removed, demoted or leave; the message says why and nothing changes', async ({ page }) => {
	const email = address('mara.quill');
	await signIn(page, email);
	const studioId = await makeStudio(page, `Ammonite sections ${tag()}`);
	const message = 'A studio must keep at least one owner: make someone else owner first.';
	const myRow = page.getByRole('row', { name: new RegExp(email.replace(/[+.]/g, '\\$&')) });

	await myRow.getByRole('button', { name: `Remove ${email}` }).click();
	await expect(page.getByRole('alert')).toHaveText(message);

	await myRow.getByRole('combobox').selectOption('viewer');
	await myRow.getByRole('button', { name: 'Change' }).click();
	await expect(page.getByRole('alert')).toHaveText(message);
	// The page does not pretend the role changed.
	await expect(myRow.getByRole('combobox')).toHaveValue('owner');

	await page.getByRole('button', { name: 'Leave this studio' }).click();
	await expect(page.getByRole('alert')).toHaveText(message);

	await page.goto(`/studios/${studioId}`);
	await expect(page.getByTestId('my-role')).toHaveText('owner');
	const rows = await sql`select role from memberships where studio_id = ${studioId}`;
	expect(rows.map((r) => r.role)).toEqual(['owner']);
});

test.describe('at phone width (390 × 844)', () => {
	test.use({ viewport: { width: 390, height: 844 } });

	async function expectNoSideways(page: Page) {
		const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
		expect(overflow, 'page scrolls sideways').toBeLessThanOrEqual(0);
	}

	test('the menu opens and closes, and the studio page can be used', async ({ page }) => {
		await page.goto('/');
		const menu = page.getByRole('button', { name: 'Menu' });
		const nav = page.getByRole('navigation', { name: 'Main' });
		await expect(menu).toBeVisible();
		await expect(menu).toHaveAttribute('aria-expanded', 'false');
		await expect(nav.getByRole('link', { name: 'Calculator' })).toBeHidden();
		await menu.click();
		await expect(menu).toHaveAttribute('aria-expanded', 'true');
		await expect(nav.getByRole('link', { name: 'Sign in' })).toBeVisible();
		await menu.click();
		await expect(nav.getByRole('link', { name: 'Sign in' })).toBeHidden();
		await expectNoSideways(page);

		const email = address('pebble.finch');
		await signIn(page, email, '/');
		await menu.click();
		await nav.getByRole('link', { name: 'Studios' }).click();
		await expect(page).toHaveURL(/\/studios$/);
		await expect(nav.getByRole('link', { name: 'Studios' })).toBeHidden();
		await expectNoSideways(page);

		await makeStudio(page, `Moss on the sill ${tag()}`);
		await expectNoSideways(page);
		for (const name of ['Send invitation', 'Rename', 'Delete studio', `Remove ${email}`]) {
			const box = await page.getByRole('button', { name }).boundingBox();
			expect(box, name).not.toBeNull();
			expect(box!.x, name).toBeGreaterThanOrEqual(0);
			expect(box!.x + box!.width, name).toBeLessThanOrEqual(390);
			expect(box!.height, `${name} is big enough to tap`).toBeGreaterThanOrEqual(24);
		}
		const inviteeEmail = address('ines.marlow');
		await invite(page, inviteeEmail, 'editor');
		await expect(page.getByText(`${inviteeEmail} as editor, until`)).toBeVisible();
		await expectNoSideways(page);
	});
});
