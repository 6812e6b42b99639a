// Paid seats in a real browser: the club's owner gives a workshop a capacity and a price (a price under
// the currency's smallest payment is refused beside the field), publishes it; a new student books a
// seat from the public page, pays on the payment fake's page and lands on the workshop as a student;
// the owner sees the payment on the roster, cancels it with a refund, and the CSV export says so.
import { randomUUID } from 'node:crypto';
import type { Page } from '@playwright/test';
import { expect, signIn, signedInAs, test, waitForMail } from './fixtures';

const OWNER = 'mara.quill@fernhill.example';
const tag = () => randomUUID().slice(0, 8);

async function visit(page: Page, url: string) {
	await page.goto(url);
	await page.waitForLoadState('networkidle');
}

test('sell a seat: price and capacity, book and pay on the checkout page, land as a student, cancel with a refund', async ({ page, context, browser, baseURL }) => {
	test.setTimeout(120_000);
	await signedInAs(context, browser, baseURL, OWNER);
	const title = `Paid evening ${tag()}`;

	await visit(page, '/workshops');
	await page.getByLabel('Studio').selectOption({ label: 'Fernhill Geology Circle' });
	await page.getByLabel('Title').fill(title);
	await page.getByLabel('Capacity').fill('3');
	await page.getByRole('button', { name: 'Create workshop' }).click();
	await expect(page.getByRole('heading', { level: 1, name: title })).toBeVisible();
	const workshopPath = new URL(page.url()).pathname;
	await page.waitForLoadState('networkidle');

	await page.getByLabel('Starts').fill('2027-03-11T18:30');
	await page.getByLabel('Ends').fill('2027-03-11T21:00');
	await page.getByLabel('Place').fill('Fernhill Community Hall');
	await page.getByRole('button', { name: 'Add session' }).click();
	await expect(page.getByTestId('sessions')).toContainText('Fernhill Community Hall');

	// A price below the smallest payment is refused beside the field; then 12.50 EUR.
	await page.getByLabel('Price', { exact: true }).fill('0.20');
	await page.getByLabel('Currency').selectOption('eur');
	await page.getByRole('button', { name: 'Save price' }).click();
	await expect(page.locator('#w-price-error')).toContainText('at least €0.50');
	await expect(page.getByLabel('Price', { exact: true })).toHaveAttribute('aria-invalid', 'true');
	await page.getByLabel('Price', { exact: true }).fill('12.50');
	await page.getByRole('button', { name: 'Save price' }).click();
	await expect(page.getByText('Price saved.')).toBeVisible();
	await expect(page.getByTestId('workshop-price')).toHaveText('€12.50 a seat');

	await page.getByLabel('Capacity (students)').fill('2');
	await page.getByRole('radio', { name: /^Published/ }).check();
	await page.getByRole('button', { name: 'Save details' }).click();
	await expect(page.getByTestId('workshop-state')).toHaveText('published');
	const publicPath = await page.getByRole('link', { name: 'Public page' }).getAttribute('href');
	expect(publicPath).toMatch(/^\/w\//);

	// A new student, in a browser of their own, books from the public page.
	const student = `seat.buyer.${tag()}@fernhill.example`;
	const studentContext = await browser.newContext({ baseURL });
	const s = await studentContext.newPage();
	await signIn(s, student, publicPath!);
	await expect(s.getByRole('heading', { level: 1, name: title })).toBeVisible();
	await expect(s.getByTestId('price')).toContainText('€12.50 a seat');
	await expect(s.getByTestId('seats-left')).toContainText('2 of 2 seats left');
	await s.getByRole('button', { name: 'Book a seat (€12.50)' }).click();

	// The payment fake's hosted page, on this machine.
	await expect(s.getByRole('heading', { name: 'Test payment' })).toBeVisible();
	expect(new URL(s.url()).hostname).toBe('127.0.0.1');
	await expect(s.getByTestId('fake-amount')).toHaveText('12.50 EUR');
	await s.getByRole('button', { name: 'Pay' }).click();

	// Back on the workshop as a student, with a receipt in the mail.
	await expect(s.getByRole('heading', { level: 1, name: title })).toBeVisible();
	expect(new URL(s.url()).pathname).toBe(workshopPath);
	await expect(s.getByTestId('booked-notice')).toBeVisible();
	await expect(s.getByText('you: student')).toBeVisible();
	const receipt = await waitForMail(s, student, /^Receipt/);
	expect(receipt.text).toContain('€12.50');

	// The owner sees the payment on the roster, cancels it with a refund.
	await visit(page, `${workshopPath}/roster`);
	await expect(page.getByRole('table', { name: 'Students' })).toContainText(student);
	const row = page.getByTestId('booking-row').filter({ hasText: student });
	await expect(row.getByTestId('booking-state')).toHaveText('paid');
	await expect(page.getByTestId('bookings-summary')).toHaveText('1 paid seat, 0 refunds.');
	await row.getByRole('button', { name: `Cancel the booking of ${student} with a refund` }).click();
	await row.getByRole('button', { name: 'Refund €12.50 and remove' }).click();
	await expect(page.getByText('The booking is cancelled and the payment refunded')).toBeVisible();
	await expect(row.getByTestId('booking-state')).toHaveText('refunded');
	await expect(page.getByText('No students yet.')).toBeVisible();
	const refund = await waitForMail(s, student, /^Refund/);
	expect(refund.text).toContain('The instructor cancelled your booking.');

	const csv = await page.request.get(`${workshopPath}/roster/bookings.csv`);
	expect(csv.status()).toBe(200);
	expect(csv.headers()['content-type']).toContain('text/csv');
	expect(await csv.text()).toMatch(new RegExp(`${student.replace(/[.+]/g, '\\$&')},refunded,12\\.50,EUR,`));

	// The roster prints as a list: no forms or buttons on paper.
	await page.emulateMedia({ media: 'print' });
	await expect(page.getByRole('button', { name: 'Send invitations' })).toBeHidden();
	await expect(page.getByRole('link', { name: 'Export CSV' })).toBeHidden();
	await expect(page.getByRole('table', { name: 'Bookings' })).toBeVisible();
	await studentContext.close();
});

test('the demo’s spring evening sells seats: its public page, signed out, shows the price, the seats and the way to book', async ({ page }) => {
	await visit(page, '/w/small-light-spring-evening');
	await expect(page.getByRole('heading', { level: 1, name: 'Small Light, Big Detail: the spring evening' })).toBeVisible();
	await expect(page.getByTestId('price')).toContainText('18.00');
	await expect(page.getByTestId('seats-left')).toContainText('of 10 seats left');
	await expect(page.getByRole('heading', { name: 'Book a seat' })).toBeVisible();
	await expect(page.getByRole('link', { name: 'Sign in to book a seat' })).toBeVisible();
});
