// Every page checked with axe (WCAG 2.1 A and AA rules), in the light and the dim theme, at desktop
// and phone width: any serious or critical violation fails, named with its rule, page and element.
import AxeBuilder from '@axe-core/playwright';
import type { Page } from '@playwright/test';
import { expect, signedInAs, test } from './fixtures';

const OWNER = 'mara.quill@fernhill.example';
// The seeded quartz cluster (src/lib/server/seed/notebook-data.ts): five revisions.
const QUARTZ_ID = '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000001';

interface Found {
	page: string;
	rule: string;
	impact: string;
	help: string;
	targets: string[];
}

// The seeded workshop "Small Light, Big Detail" (src/lib/server/seed/workshop.ts).
const WORKSHOP = '/workshops/7b2c4e90-1a3f-4d6b-8e25-6c0f00000001';
const LESSON = `${WORKSHOP}/lessons/7b2c4e90-1a3f-4d6b-8e25-6c0f00000101`;

const WCAG_21_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];

const serious = (violations: Awaited<ReturnType<AxeBuilder['analyze']>>['violations'], name: string): Found[] =>
	violations
		.filter((v) => v.impact === 'serious' || v.impact === 'critical')
		.map((v) => ({ page: name, rule: v.id, impact: v.impact!, help: v.help, targets: v.nodes.map((n) => n.target.join(' ')) }));

/** Waits until the page is live (scripts loaded, lazy panels in), then runs axe over it. */
async function audit(page: Page, name: string, url: string): Promise<Found[]> {
	const res = await page.goto(url);
	expect(res, name).not.toBeNull();
	await page.waitForLoadState('networkidle');
	return serious((await new AxeBuilder({ page }).withTags(WCAG_21_AA).analyze()).violations, name);
}

const SIGNED_OUT: [string, string][] = [
	['home', '/'],
	['sign-in', '/signin'],
	['calculator', '/calc'],
	['API reference', '/api'],
	['public page of a workshop', '/w/small-light-big-detail']
];

const SIGNED_IN: [string, string][] = [
	['studios', '/studios'],
	['notebook list', '/setups'],
	['setup page with the editor', `/setups/${QUARTZ_ID}`],
	['history', `/setups/${QUARTZ_ID}/history`],
	['compare', `/setups/${QUARTZ_ID}/compare?from=2&to=4`],
	['gear', '/gear'],
	['account', '/account'],
	['workshops', '/workshops'],
	['a workshop', WORKSHOP],
	['a lesson', LESSON],
	['a step', `${WORKSHOP}/steps/7b2c4e90-1a3f-4d6b-8e25-6c0f00000202`],
	['a roster', `${WORKSHOP}/roster`],
	['a lesson handout', `${LESSON}/handout`],
	['an exercise with its hand-ins', `${WORKSHOP}/exercises/7b2c4e90-1a3f-4d6b-8e25-6c0f00000301`],
	['setting an exercise', `${LESSON}/exercises/new`],
	['a gradebook', `${WORKSHOP}/gradebook`],
	['error page (404)', '/setups/00000000-0000-4000-8000-000000000000']
];

for (const scheme of ['light', 'dark'] as const) {
	for (const [width, viewport] of [
		['desktop', { width: 1280, height: 900 }],
		['phone', { width: 390, height: 844 }]
	] as const) {
		test(`no serious or critical axe violation on any page: ${scheme} theme, ${width} width`, async ({ page, context, browser, baseURL }) => {
			test.setTimeout(180_000);
			await page.setViewportSize(viewport);
			await page.emulateMedia({ colorScheme: scheme });
			const found: Found[] = [];
			for (const [name, url] of SIGNED_OUT) found.push(...(await audit(page, name, url)));

			await signedInAs(context, browser, baseURL, OWNER);
			// A studio of the owner's, from the studios page.
			await page.goto('/studios');
			const studio = await page.locator('main a[href^="/studios/"]').first().getAttribute('href');
			expect(studio).toMatch(/^\/studios\/[0-9a-f-]{36}$/);
			for (const [name, url] of [...SIGNED_IN, ['a studio', studio!] as [string, string]])
				found.push(...(await audit(page, name, url)));

			// The theme really was the one asked for on every page.
			expect(await page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(scheme === 'dark');
			expect(found, found.map((f) => `${f.page}: ${f.rule} (${f.impact}) ${f.help}: ${f.targets.join(', ')}`).join('\n')).toEqual([]);
		});
	}
}

test('a form error is tied to its field and announced', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	await page.goto('/studios');
	await page.waitForLoadState('networkidle');
	const name = page.getByLabel('Name', { exact: true });
	await name.fill('   ');
	await page.getByRole('button', { name: 'Make the studio' }).click();
	// The message is an alert (read out as it appears) and the field's description; the field is invalid.
	const alert = page.getByRole('alert').filter({ hasText: 'Give the studio a name.' });
	await expect(alert).toBeVisible();
	await expect(name).toHaveAttribute('aria-invalid', 'true');
	await expect(name).toHaveAccessibleDescription('Give the studio a name.');
});

test.describe('times in the reader’s own time zone', () => {
	test.use({ timezoneId: 'Pacific/Auckland' });

	test('the history shows a seeded save at its local time, and the UTC time without JavaScript', async ({ page, context, browser, baseURL }) => {
		await signedInAs(context, browser, baseURL, OWNER);
		// Revision 1 of the quartz cluster was saved at 18:40 UTC on 6 October 2026: 07:40 the next morning in Auckland (NZDT, UTC+13).
		await page.goto(`/setups/${QUARTZ_ID}/history`);
		const first = page.getByTestId('revision-timeline').locator('li[data-revision="1"] time');
		await expect(first).toHaveAttribute('datetime', '2026-10-06T18:40:00.000Z');
		await expect(first).toHaveText(/^7 Oct 2026, 07:40 (GMT\+13|NZDT)$/);
	});
});

test.describe('times without JavaScript', () => {
	test.use({ javaScriptEnabled: false });

	test('the server writes them in UTC and says so', async ({ page, context, browser, baseURL }) => {
		await signedInAs(context, browser, baseURL, OWNER);
		await page.goto(`/setups/${QUARTZ_ID}/history`);
		await expect(page.getByTestId('revision-timeline').locator('li[data-revision="1"] time')).toHaveText('6 Oct 2026, 18:40 UTC');
	});
});
