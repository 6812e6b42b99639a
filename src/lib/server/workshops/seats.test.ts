// Paid seats on the real database, the running app (it receives the webhooks) and the payment fake
// (PAYMENT_FAKE_URL), all started by `npm test`: a seat held at checkout and confirmed only by a
// verified payment event; events repeated or out of order never book twice or lose a booking; a late
// payment into a full workshop refunded with a letter saying why; forged and replayed webhooks refused;
// the fake down during checkout; fifty buyers racing for ten seats.
import { afterAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import Stripe from 'stripe';

const FAKE = process.env.PAYMENT_FAKE_URL;
const BASE = process.env.TEST_BASE_URL;
if (!process.env.DATABASE_URL || !process.env.DEV_MAIL_URL || !BASE || !FAKE || !process.env.STRIPE_WEBHOOK_SECRET) {
	throw new Error('DATABASE_URL, DEV_MAIL_URL, TEST_BASE_URL, PAYMENT_FAKE_URL and STRIPE_WEBHOOK_SECRET are not set: run these tests through `npm test`.');
}

const { client, db } = await import('$lib/server/db');
const { seatBookings, workshopMembers, workshops } = await import('$lib/server/db/schema');
const ws = await import('$lib/server/workshops');
const { attempt } = await import('$lib/server/testing/authz-world');
const { makeStudio, makeUser } = await import('$lib/server/testing/studio-world');
const { sessionSchema, workshopCreateSchema, workshopDetailsSchema } = await import('$lib/workshops/inputs');
const { priceSchema } = await import('$lib/seats/inputs');
const { countSeatsTaken } = await import('$lib/server/db/queries/workshops');
type SessionUser = Awaited<ReturnType<typeof makeUser>>;

afterAll(async () => {
	await client.end({ timeout: 5 });
});

const signer = new Stripe('sk_test_signer');
const ctx = { origin: BASE! };

/** A published workshop of the studio's owner, with one session, `capacity` seats at 25.00 EUR. */
async function paidWorkshop(capacity: number) {
	const { studioId, people } = await makeStudio(['owner']);
	const owner = people[0].user;
	const w = await ws.createWorkshop(owner, workshopCreateSchema.parse({ studioId, title: 'Small Light, Big Detail', capacity }));
	await ws.addSession(owner, w.id, sessionSchema.parse({ startsAt: '2027-01-14T18:30:00Z', endsAt: '2027-01-14T21:00:00Z', place: 'Community hall' }));
	await ws.updateWorkshop(owner, w.id, workshopDetailsSchema.parse({ title: w.title, summary: '', capacity, state: 'published' }));
	await ws.setWorkshopPrice(owner, w.id, priceSchema.parse({ amount: '25.00', currency: 'eur' }));
	return { owner, workshopId: w.id, slug: w.slug };
}

interface FakeState {
	sessions: { id: string; payment_status: string; status: string; payment_intent: string | null }[];
	payments: { id: string; session: string; amount: number; refunded: number }[];
	refunds: { id: string; payment_intent: string; amount: number }[];
}
const fakeState = async (): Promise<FakeState> => (await fetch(`${FAKE}/_fake/state`)).json();

/** Pays a checkout as the fake's "Pay" button does; the fake answers once the app took the webhook. */
async function pay(checkoutUrl: string) {
	const sessionId = checkoutUrl.split('/').pop()!;
	const res = await fetch(`${FAKE}/_fake/sessions/${sessionId}/pay`, { method: 'POST' });
	expect(res.status).toBe(200);
	return ((await res.json()) as { outcome: string; session: { id: string; payment_intent: string } });
}

async function bookingsOf(workshopId: string) {
	return db.select().from(seatBookings).where(eq(seatBookings.workshopId, workshopId));
}

async function students(workshopId: string) {
	return db.select().from(workshopMembers).where(and(eq(workshopMembers.workshopId, workshopId), eq(workshopMembers.role, 'student')));
}

async function mailTo(email: string, subject: RegExp) {
	for (let i = 0; i < 50; i++) {
		const messages = (await (await fetch(`${process.env.DEV_MAIL_URL}/messages`)).json()) as { to: string; subject: string; text: string }[];
		const hit = messages.find((m) => m.to.includes(email) && subject.test(m.subject));
		if (hit) return hit;
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`no mail to ${email} matching ${subject}`);
}

/** Posts a webhook to the app as the provider would, signed with the given secret and timestamp. */
async function deliver(event: object, { secret = process.env.STRIPE_WEBHOOK_SECRET!, timestamp }: { secret?: string; timestamp?: number } = {}) {
	const payload = JSON.stringify(event);
	const header = signer.webhooks.generateTestHeaderString({ payload, secret, ...(timestamp ? { timestamp } : {}) });
	return fetch(`${BASE}/payments/webhook`, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': header }, body: payload });
}

const completedEvent = (id: string, bookingId: string, sessionId: string, paymentIntent: string) => ({
	id,
	object: 'event',
	type: 'checkout.session.completed',
	data: { object: { id: sessionId, object: 'checkout.session', status: 'complete', payment_status: 'paid', client_reference_id: bookingId, metadata: { bookingId }, payment_intent: paymentIntent } }
});

async function refusalOf(work: () => Promise<unknown>) {
	const got = await attempt(work);
	expect(got.outcome).toBe('rule');
	return got.error as { field: string; message: string; status: number };
}

describe('price', () => {
	it('a price below the currency’s smallest payment is refused naming the amount; empty is free', () => {
		const low = priceSchema.safeParse({ amount: '0.20', currency: 'gbp' });
		expect(low.success).toBe(false);
		expect(low.error!.issues[0]).toMatchObject({ path: ['amount'] });
		expect(low.error!.issues[0].message).toMatch(/at least £0\.30/);
		expect(priceSchema.parse({ amount: '0.30', currency: 'GBP' })).toEqual({ priceMinor: 30, currency: 'gbp' });
		expect(priceSchema.parse({ amount: '', currency: 'eur' })).toEqual({ priceMinor: 0, currency: 'eur' });
		expect(priceSchema.safeParse({ amount: '12.5', currency: 'jpy' }).error!.issues[0].message).toMatch(/whole number/);
		expect(priceSchema.safeParse({ amount: '10', currency: 'xyz' }).error!.issues[0].path).toEqual(['currency']);
	});
});

describe('booking a seat', () => {
	it('a draft, an archived or a free workshop is refused with the field named; nothing is held', async () => {
		const w = await paidWorkshop(5);
		const buyer = await makeUser('ines.marlow');
		const details = (state: string, capacity = 5) => workshopDetailsSchema.parse({ title: 'Small Light, Big Detail', summary: '', capacity, state });
		await ws.updateWorkshop(w.owner, w.workshopId, details('draft'));
		expect(await refusalOf(() => ws.bookSeat(buyer, w.slug, ctx))).toMatchObject({ field: 'state', message: expect.stringMatching(/draft/) });
		await ws.updateWorkshop(w.owner, w.workshopId, details('archived'));
		expect(await refusalOf(() => ws.bookSeat(buyer, w.slug, ctx))).toMatchObject({ field: 'state', message: expect.stringMatching(/archived/) });
		await ws.updateWorkshop(w.owner, w.workshopId, details('published'));
		await ws.setWorkshopPrice(w.owner, w.workshopId, priceSchema.parse({ amount: '', currency: 'eur' }));
		expect((await refusalOf(() => ws.bookSeat(buyer, w.slug, ctx))).field).toBe('price');
		expect(await bookingsOf(w.workshopId)).toEqual([]);
	});

	it('a paid checkout confirms the seat once: the buyer is a student with a receipt; the same event again changes nothing', async () => {
		const w = await paidWorkshop(3);
		const buyer = await makeUser('tobias.wren');
		const { bookingId, checkoutUrl } = await ws.bookSeat(buyer, w.slug, ctx);
		// A second click while the hold runs reuses the same checkout.
		expect((await ws.bookSeat(buyer, w.slug, ctx)).checkoutUrl).toBe(checkoutUrl);
		expect((await countSeatsTaken(w.workshopId)).held).toBe(1);
		expect((await ws.publicWorkshop(null, w.slug)).seatsLeft).toBe(2);
		const paid = await pay(checkoutUrl);
		expect(paid.outcome).toBe('paid');
		const [booking] = await bookingsOf(w.workshopId);
		expect(booking).toMatchObject({ id: bookingId, state: 'confirmed', paymentIntentId: paid.session.payment_intent });
		expect((await students(w.workshopId)).map((s) => s.userId)).toEqual([buyer.id]);
		const receipt = await mailTo(buyer.email, /^Receipt/);
		expect(receipt.text).toContain('€25.00');
		expect(receipt.text).toContain(bookingId);
		// The buyer's return after the webhook: already confirmed.
		expect((await ws.returnFromCheckout(buyer, bookingId)).state).toBe('confirmed');

		// The provider delivers the same event again: acknowledged, nothing changes.
		const eventId = ((await (await fetch(`${FAKE}/_fake/state`)).json()) as { deliveries: { event: string; type: string }[] }).deliveries
			.filter((d) => d.type === 'checkout.session.completed')
			.map((d) => d.event)
			.at(-1)!;
		const again = await fetch(`${FAKE}/_fake/events/${eventId}/resend`, { method: 'POST' });
		expect(((await again.json()) as { status: number }).status).toBe(200);
		expect(await students(w.workshopId)).toHaveLength(1);
		expect((await bookingsOf(w.workshopId)).map((b) => b.state)).toEqual(['confirmed']);
		// Paying the same checkout again charges nothing more.
		expect((await pay(checkoutUrl)).outcome).toBe('already-paid');
		expect((await fakeState()).payments.filter((p) => p.session === paid.session.id)).toHaveLength(1);
		expect(await refusalOf(() => ws.bookSeat(buyer, w.slug, ctx))).toMatchObject({ message: 'You are already in this workshop.' });
	});

	it('events out of order: an expiry before the payment still confirms the paid seat; a second payment event books nothing twice', async () => {
		const w = await paidWorkshop(2);
		const buyer = await makeUser('pebble.finch');
		const { bookingId } = await ws.bookSeat(buyer, w.slug, ctx);
		const [held] = await bookingsOf(w.workshopId);
		const expired = { id: `evt_expired_${bookingId}`, object: 'event', type: 'checkout.session.expired', data: { object: { id: held.checkoutSessionId, object: 'checkout.session', status: 'expired' } } };
		expect((await deliver(expired)).status).toBe(200);
		expect((await bookingsOf(w.workshopId))[0].state).toBe('released');
		expect((await deliver(completedEvent(`evt_paid_${bookingId}`, bookingId, held.checkoutSessionId!, `pi_ooo_${bookingId}`))).status).toBe(200);
		expect((await bookingsOf(w.workshopId))[0]).toMatchObject({ state: 'confirmed', paymentIntentId: `pi_ooo_${bookingId}` });
		// The same payment told again under another event id: still one seat.
		expect((await deliver(completedEvent(`evt_paid2_${bookingId}`, bookingId, held.checkoutSessionId!, `pi_ooo_${bookingId}`))).status).toBe(200);
		expect(await students(w.workshopId)).toHaveLength(1);
		expect((await bookingsOf(w.workshopId)).map((b) => b.state)).toEqual(['confirmed']);
	});

	it('cancelling at checkout gives the seat back at once and closes the checkout', async () => {
		const w = await paidWorkshop(1);
		const [a, b] = [await makeUser('vera.stone'), await makeUser('otto.bram')];
		const { bookingId, checkoutUrl } = await ws.bookSeat(a, w.slug, ctx);
		expect(await refusalOf(() => ws.bookSeat(b, w.slug, ctx))).toMatchObject({ message: ws.FULL_MESSAGE, status: 409 });
		expect((await ws.cancelCheckout(a, bookingId)).state).toBe('released');
		expect((await fakeState()).sessions.find((s) => checkoutUrl.endsWith(s.id))?.status).toBe('expired');
		await ws.bookSeat(b, w.slug, ctx);
		expect((await countSeatsTaken(w.workshopId)).held).toBe(1);
	});
});

describe('late payments and refunds', () => {
	it('a payment after its hold ran out into a full workshop is refunded in full and the buyer told why', async () => {
		const w = await paidWorkshop(1);
		const [late, onTime] = [await makeUser('ines.marlow'), await makeUser('tobias.wren')];
		const first = await ws.bookSeat(late, w.slug, ctx);
		await db.update(seatBookings).set({ holdExpiresAt: new Date(Date.now() - 1000) }).where(eq(seatBookings.id, first.bookingId));
		const second = await ws.bookSeat(onTime, w.slug, ctx);
		await pay(second.checkoutUrl);
		const latePaid = await pay(first.checkoutUrl);
		const rows = await bookingsOf(w.workshopId);
		expect(rows.find((r) => r.id === second.bookingId)?.state).toBe('confirmed');
		expect(rows.find((r) => r.id === first.bookingId)).toMatchObject({ state: 'refunded', refundReason: expect.stringMatching(/filled up/) });
		expect((await students(w.workshopId)).map((s) => s.userId)).toEqual([onTime.id]);
		const refunds = (await fakeState()).refunds.filter((r) => r.payment_intent === latePaid.session.payment_intent);
		expect(refunds).toEqual([expect.objectContaining({ amount: 2500 })]);
		const letter = await mailTo(late.email, /^Refund/);
		expect(letter.text).toMatch(/filled up/);
		expect((await ws.returnFromCheckout(late, first.bookingId)).state).toBe('refunded');
	});

	it('an instructor cancels a paid seat with a refund: the student leaves, the roster and the CSV show it', async () => {
		const w = await paidWorkshop(4);
		const buyer = await makeUser('pebble.finch');
		const { bookingId, checkoutUrl } = await ws.bookSeat(buyer, w.slug, ctx);
		const paid = await pay(checkoutUrl);
		const stranger = await makeUser('vera.stone');
		expect((await attempt(() => ws.cancelBookingWithRefund(stranger, w.workshopId, bookingId))).outcome).toBe(404);
		expect(await ws.cancelBookingWithRefund(w.owner, w.workshopId, bookingId)).toEqual({ refunded: true });
		expect(await students(w.workshopId)).toEqual([]);
		expect((await fakeState()).refunds.filter((r) => r.payment_intent === paid.session.payment_intent)).toHaveLength(1);
		// Twice is refused, and refunds nothing more.
		expect((await refusalOf(() => ws.cancelBookingWithRefund(w.owner, w.workshopId, bookingId))).field).toBe('booking');
		expect((await fakeState()).refunds.filter((r) => r.payment_intent === paid.session.payment_intent)).toHaveLength(1);
		const [row] = await ws.workshopBookings(w.owner, w.workshopId);
		expect(row).toMatchObject({ shownState: 'refunded', amount: '€25.00', paymentId: paid.session.payment_intent });
		const { csv } = await ws.bookingsCsv(w.owner, w.workshopId);
		const [header, line] = csv.trim().split('\r\n');
		expect(header.split(',')).toEqual(['booking', 'name', 'email', 'state', 'amount', 'currency', 'booked_at', 'paid_at', 'refunded_at', 'refund_reason', 'payment_id', 'refund_id']);
		expect(line).toContain(`${bookingId},pebble.finch,${buyer.email},refunded,25.00,EUR,`);
		expect((await mailTo(buyer.email, /^Refund/)).text).toMatch(/instructor cancelled/);
	});

	it('a capacity below the seats sold and held is refused, naming the field', async () => {
		const w = await paidWorkshop(3);
		const [a, b] = [await makeUser('ines.marlow'), await makeUser('otto.bram')];
		await pay((await ws.bookSeat(a, w.slug, ctx)).checkoutUrl);
		await ws.bookSeat(b, w.slug, ctx);
		const e = await refusalOf(() => ws.updateWorkshop(w.owner, w.workshopId, workshopDetailsSchema.parse({ title: 'Small Light, Big Detail', summary: '', capacity: 1, state: 'published' })));
		expect(e.field).toBe('capacity');
		expect(e.message).toMatch(/1 student is already enrolled and 1 seat is held/);
		const [row] = await db.select().from(workshops).where(eq(workshops.id, w.workshopId));
		expect(row.capacity).toBe(3);
	});
});

describe('webhooks', () => {
	it('a forged signature, a replayed old event and an unsigned one are refused and change nothing', async () => {
		const w = await paidWorkshop(2);
		const buyer = await makeUser('tobias.wren');
		const { bookingId } = await ws.bookSeat(buyer, w.slug, ctx);
		const [held] = await bookingsOf(w.workshopId);
		const event = completedEvent(`evt_forged_${bookingId}`, bookingId, held.checkoutSessionId!, `pi_forged_${bookingId}`);
		expect((await deliver(event, { secret: 'whsec_not_ours' })).status).toBe(400);
		expect((await deliver(event, { timestamp: Math.floor(Date.now() / 1000) - 3600 })).status).toBe(400);
		const unsigned = await fetch(`${BASE}/payments/webhook`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(event) });
		expect(unsigned.status).toBe(400);
		expect((await bookingsOf(w.workshopId))[0].state).toBe('held');
		expect(await students(w.workshopId)).toEqual([]);
	});
});

describe('the payment service down during checkout', () => {
	it('a hold expires cleanly, a booking tried meanwhile holds nothing, and the payment made when it returns is charged once', async () => {
		const w = await paidWorkshop(1);
		const [a, b] = [await makeUser('vera.stone'), await makeUser('pebble.finch')];
		const first = await ws.bookSeat(a, w.slug, { ...ctx, holdMs: 1500 });
		await fetch(`${FAKE}/_fake/outage?ms=3000`, { method: 'POST' });
		await new Promise((r) => setTimeout(r, 200));
		// While it is down: a new booking is refused with a clear message and holds nothing.
		await new Promise((r) => setTimeout(r, 1400));
		const down = await refusalOf(() => ws.bookSeat(b, w.slug, ctx));
		expect(down).toMatchObject({ status: 503, message: expect.stringMatching(/did not answer.*nothing was charged/) });
		expect((await bookingsOf(w.workshopId)).filter((r) => r.userId === b.id).map((r) => r.state)).toEqual(['released']);
		// The first hold ran out on its own: the seat is free again.
		expect((await countSeatsTaken(w.workshopId)).taken).toBe(0);
		// Back up: the buyer still on the checkout page pays; the seat is free, so it is confirmed, once.
		for (let i = 0; i < 50 && (await fetch(`${FAKE}/_fake/state`).catch(() => null)) === null; i++) await new Promise((r) => setTimeout(r, 100));
		const paid = await pay(first.checkoutUrl);
		expect(paid.outcome).toBe('paid');
		expect((await pay(first.checkoutUrl)).outcome).toBe('already-paid');
		expect((await bookingsOf(w.workshopId)).find((r) => r.id === first.bookingId)?.state).toBe('confirmed');
		expect((await fakeState()).payments.filter((p) => p.session === paid.session.id)).toHaveLength(1);
		expect(await students(w.workshopId)).toHaveLength(1);
	});
});

describe('a refund asked while the payment service is down', () => {
	it('stays due, and the next round of retries refunds it once and tells the buyer', async () => {
		const w = await paidWorkshop(2);
		const buyer = await makeUser('otto.bram');
		const { bookingId, checkoutUrl } = await ws.bookSeat(buyer, w.slug, ctx);
		const paid = await pay(checkoutUrl);
		await fetch(`${FAKE}/_fake/outage?ms=2500`, { method: 'POST' });
		await new Promise((r) => setTimeout(r, 200));
		expect(await ws.cancelBookingWithRefund(w.owner, w.workshopId, bookingId)).toEqual({ refunded: false });
		expect((await bookingsOf(w.workshopId))[0].state).toBe('refund_due');
		for (let i = 0; i < 80 && (await fetch(`${FAKE}/_fake/state`).catch(() => null)) === null; i++) await new Promise((r) => setTimeout(r, 100));
		expect(await ws.retryDueRefunds()).toBeGreaterThanOrEqual(1);
		expect((await bookingsOf(w.workshopId))[0].state).toBe('refunded');
		// Another round (another app server's, say) refunds nothing more.
		await ws.retryDueRefunds();
		expect((await fakeState()).refunds.filter((r) => r.payment_intent === paid.session.payment_intent)).toHaveLength(1);
		expect((await mailTo(buyer.email, /^Refund/)).text).toMatch(/instructor cancelled/);
	});
});

describe('fifty buyers racing for ten seats', () => {
	it('exactly ten are confirmed, forty told it is full, and no payment is kept without a seat', async () => {
		const w = await paidWorkshop(10);
		const buyers: SessionUser[] = [];
		for (let i = 0; i < 50; i++) buyers.push(await makeUser(`buyer.${i}`));
		const tries = await Promise.all(buyers.map((u) => attempt(() => ws.bookSeat(u, w.slug, ctx))));
		const held = tries.filter((t) => t.outcome === 'ok').map((t) => t.result as { bookingId: string; checkoutUrl: string });
		const full = tries.filter((t) => t.outcome === 'rule' && (t.error as Error).message === ws.FULL_MESSAGE);
		expect(held).toHaveLength(10);
		expect(full).toHaveLength(40);

		// Five holds run out; five of those told it was full book again and get those seats.
		const lapsed = held.slice(0, 5);
		for (const h of lapsed) await db.update(seatBookings).set({ holdExpiresAt: new Date(Date.now() - 1000) }).where(eq(seatBookings.id, h.bookingId));
		const refusedBuyers = buyers.filter((_, i) => tries[i].outcome === 'rule').slice(0, 5);
		const second = await Promise.all(refusedBuyers.map((u) => ws.bookSeat(u, w.slug, ctx)));
		expect(await refusalOf(() => ws.bookSeat(buyers.find((_, i) => tries[i].outcome === 'rule' && !refusedBuyers.includes(buyers[i]))!, w.slug, ctx))).toMatchObject({ message: ws.FULL_MESSAGE });

		// All fifteen checkouts are paid at once, the five lapsed ones too.
		const paid = await Promise.all([...held, ...second].map((h) => pay(h.checkoutUrl)));
		expect(paid.every((p) => p.outcome === 'paid')).toBe(true);
		const rows = await bookingsOf(w.workshopId);
		expect(rows.filter((r) => r.state === 'confirmed')).toHaveLength(10);
		expect(rows.filter((r) => r.state === 'refunded')).toHaveLength(5);
		expect(new Set(rows.filter((r) => r.state === 'refunded').map((r) => r.id))).toEqual(new Set(lapsed.map((h) => h.bookingId)));
		expect(await students(w.workshopId)).toHaveLength(10);
		const state = await fakeState();
		const intents = new Set(paid.map((p) => p.session.payment_intent));
		const payments = state.payments.filter((p) => intents.has(p.id));
		const kept = payments.filter((p) => p.refunded < p.amount);
		expect(payments).toHaveLength(15);
		expect(kept).toHaveLength(10);
		expect(new Set(kept.map((p) => p.id))).toEqual(new Set(rows.filter((r) => r.state === 'confirmed').map((r) => r.paymentIntentId)));
	});
});
