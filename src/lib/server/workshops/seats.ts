// Paid seats: the price an instructor sets, a buyer's seat held while at the provider's hosted
// checkout, confirmed only by a verified payment (its webhook, or the buyer's return, whichever comes
// first), released when the hold runs out or the buyer cancels, and refunded when a late payment finds
// the workshop full or an instructor cancels. The seat counting and every change of a booking happen in
// the database under the workshop's row lock (queries/seats.ts); app servers keep nothing in memory.
import { env } from '$env/dynamic/private';
import { error } from '@sveltejs/kit';
import type Stripe from 'stripe';
import { authorizeWorkshop, requireUser } from '$lib/server/authz';
import { RuleViolation } from '$lib/server/errors';
import { sendMail } from '$lib/server/mail';
import { seatReceiptLetter, seatRefundLetter } from '$lib/server/mail/letters';
import { paymentProvider, paymentsConfigured, verifiedEvent } from '$lib/server/payments/provider';
import type { SessionUser } from '$lib/server/session';
import type { SeatBooking } from '$lib/server/db/schema';
import {
	attachCheckout,
	buyerOf,
	cancelConfirmedBooking,
	findBooking,
	findWorkshopBySlug,
	holdSeat,
	listBookings,
	listDueRefunds,
	markRefunded,
	releaseExpiredCheckout,
	releaseHold,
	setPrice,
	settlePaidCheckout
} from '$lib/server/db/queries/seats';
import { isUuid } from '$lib/uuid';
import { formatMoney, toMajorText } from '$lib/seats/money';
import type { PriceInput } from '$lib/seats/inputs';

/** How long a seat is kept for a buyer at checkout (SQUARELAW_SEAT_HOLD_MINUTES, default 10). */
export function holdMinutes(): number {
	const n = Number(env.SQUARELAW_SEAT_HOLD_MINUTES);
	return Number.isFinite(n) && n > 0 ? n : 10;
}

/** The provider keeps a checkout open for at least 30 minutes; a payment after our hold is settled as late. */
const CHECKOUT_MIN_OPEN_S = 30 * 60 + 60;

export async function setWorkshopPrice(user: SessionUser | null, workshopId: string, input: PriceInput) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.run');
	await setPrice(access.workshop.id, input.priceMinor, input.currency);
}

export const FULL_MESSAGE = 'The workshop is full: every seat is taken or held for a buyer at checkout.';

const STATE_REFUSALS: Record<string, string> = {
	draft: 'This workshop is still a draft: seats can be booked once the instructor publishes it.',
	archived: 'This workshop is archived: its seats are no longer sold.'
};

/**
 * "Book a seat": holds a seat and opens a hosted checkout for it; the answer is the checkout's address.
 * A workshop that is not published, free, full, or already joined is refused with the reason.
 */
export async function bookSeat(user: SessionUser | null, slug: string, context: { origin: string; holdMs?: number }): Promise<{ bookingId: string; checkoutUrl: string }> {
	const buyer = requireUser(user);
	const workshop = slug.length <= 100 ? await findWorkshopBySlug(slug) : null;
	if (!workshop) error(404, 'No such workshop.');
	if (!paymentsConfigured()) throw new RuleViolation('Payments are not set up on this server yet: ask the instructor how to pay.', 'form', 503);
	const held = await holdSeat(workshop.id, buyer.id, context.holdMs ?? holdMinutes() * 60_000);
	if (held.outcome === 'gone') error(404, 'No such workshop.');
	if (held.outcome === 'not-open') throw new RuleViolation(STATE_REFUSALS[held.state] ?? 'This workshop is not open for booking.', 'state', 409);
	if (held.outcome === 'free') throw new RuleViolation('This workshop is free: ask to join instead.', 'price');
	if (held.outcome === 'opening') throw new RuleViolation('Your seat is held and its payment page is being opened: try again in a moment.', 'form', 409);
	if (held.outcome === 'member') throw new RuleViolation('You are already in this workshop.', 'form', 409);
	if (held.outcome === 'full') throw new RuleViolation(FULL_MESSAGE, 'form', 409);
	if (held.outcome === 'held') return { bookingId: held.booking.id, checkoutUrl: held.booking.checkoutUrl! };
	const booking = held.booking;
	try {
		const session = await paymentProvider().checkout.sessions.create(
			{
				mode: 'payment',
				line_items: [{ quantity: 1, price_data: { currency: booking.currency, unit_amount: booking.amountMinor, product_data: { name: `A seat in “${workshop.title}”` } } }],
				client_reference_id: booking.id,
				metadata: { bookingId: booking.id, workshopId: workshop.id },
				customer_email: buyer.email,
				success_url: `${context.origin}/w/${workshop.slug}/booked?booking=${booking.id}`,
				cancel_url: `${context.origin}/w/${workshop.slug}/booked?booking=${booking.id}&cancelled=1`,
				expires_at: Math.max(Math.ceil(booking.holdExpiresAt.getTime() / 1000), Math.floor(Date.now() / 1000) + CHECKOUT_MIN_OPEN_S)
			},
			{ idempotencyKey: `checkout-${booking.id}` }
		);
		if (!session.url) throw new Error('the checkout session has no address');
		await attachCheckout(booking.id, session.id, session.url);
		return { bookingId: booking.id, checkoutUrl: session.url };
	} catch (e) {
		// The seat goes back at once: nothing was charged, and the buyer may try again.
		await releaseHold(booking.id);
		console.warn(`[payments] checkout for booking ${booking.id} could not start:`, e instanceof Error ? e.message : e);
		throw new RuleViolation('The payment service did not answer, so no seat was held and nothing was charged. Try again in a minute.', 'form', 503);
	}
}

export type BookingView = {
	id: string;
	state: SeatBooking['state'];
	amount: string;
	holdExpiresAt: string;
	refundReason: string | null;
	workshopId: string;
};

function bookingView(b: SeatBooking): BookingView {
	return {
		id: b.id,
		state: b.state,
		amount: formatMoney(b.amountMinor, b.currency),
		holdExpiresAt: b.holdExpiresAt.toISOString(),
		refundReason: b.refundReason,
		workshopId: b.workshopId
	};
}

/** The buyer's own booking; anyone else's is a 404. */
async function ownBooking(user: SessionUser | null, bookingId: string) {
	const buyer = requireUser(user);
	const booking = isUuid(bookingId) ? await findBooking(bookingId) : null;
	if (!booking || booking.userId !== buyer.id) error(404, 'No such booking.');
	return booking;
}

/**
 * The buyer back from checkout. The webhook usually came first; when it has not yet, the checkout is
 * asked for directly and a paid one is settled here (the same settlement, which the booking's state
 * makes happen once).
 */
export async function returnFromCheckout(user: SessionUser | null, bookingId: string): Promise<BookingView> {
	let booking = await ownBooking(user, bookingId);
	if ((booking.state === 'held' || booking.state === 'released') && booking.checkoutSessionId) {
		try {
			const session = await paymentProvider().checkout.sessions.retrieve(booking.checkoutSessionId);
			if (session.payment_status === 'paid') {
				await settle(booking.id, paymentIntentOf(session), null);
				booking = (await findBooking(booking.id)) ?? booking;
			}
		} catch (e) {
			console.warn(`[payments] checkout ${booking.checkoutSessionId} could not be read:`, e instanceof Error ? e.message : e);
		}
	}
	return bookingView(booking);
}

/** The buyer cancelled at checkout: the seat goes back now, and the checkout is closed so it cannot be paid later. */
export async function cancelCheckout(user: SessionUser | null, bookingId: string): Promise<BookingView> {
	const booking = await ownBooking(user, bookingId);
	if (booking.state === 'held' && (await releaseHold(booking.id)) && booking.checkoutSessionId) {
		await paymentProvider()
			.checkout.sessions.expire(booking.checkoutSessionId)
			.catch((e) => console.warn(`[payments] checkout ${booking.checkoutSessionId} could not be closed:`, e instanceof Error ? e.message : e));
	}
	return bookingView((await findBooking(booking.id)) ?? booking);
}

function paymentIntentOf(session: Stripe.Checkout.Session): string {
	const pi = session.payment_intent;
	return typeof pi === 'string' ? pi : (pi?.id ?? `checkout:${session.id}`);
}

/** Settles a paid checkout, then tells the buyer: a receipt, or the refund and why. */
async function settle(bookingId: string, paymentIntentId: string, event: { id: string; type: string } | null) {
	const result = await settlePaidCheckout(bookingId, paymentIntentId, event);
	if (result.outcome === 'confirmed') await sendReceipt(result.booking);
	if (result.outcome === 'refund') await refundBooking(result.booking);
	return result;
}

async function workshopUrl(bookingId: string) {
	const buyer = await buyerOf(bookingId);
	const origin = env.ORIGIN ?? '';
	return buyer ? { buyer, workshopUrl: `${origin}/workshops/${buyer.workshopId}`, publicUrl: `${origin}/w/${buyer.slug}` } : null;
}

async function sendReceipt(booking: SeatBooking) {
	const found = await workshopUrl(booking.id);
	if (!found) return;
	await sendMail(seatReceiptLetter(found.buyer.email, found.buyer.workshopTitle, formatMoney(booking.amountMinor, booking.currency), booking.paidAt ?? new Date(), booking.id, found.workshopUrl)).catch(
		(e) => console.warn(`[payments] receipt for booking ${booking.id} not sent:`, e instanceof Error ? e.message : e)
	);
}

/**
 * Returns a payment in full, once: the provider's idempotency key is the booking, so a retry after a
 * failure never refunds twice. A refund that fails stays due and is tried again when the roster opens
 * and every few minutes (`retryDueRefunds`).
 */
async function refundBooking(booking: SeatBooking): Promise<boolean> {
	if (!booking.paymentIntentId) return false;
	let refundId: string | null = null;
	try {
		const refund = await paymentProvider().refunds.create(
			{ payment_intent: booking.paymentIntentId, reason: 'requested_by_customer', metadata: { bookingId: booking.id } },
			{ idempotencyKey: `refund-${booking.id}` }
		);
		refundId = refund.id;
	} catch (e) {
		const code = (e as { code?: string }).code;
		if (code !== 'charge_already_refunded') {
			console.warn(`[payments] refund for booking ${booking.id} failed, will retry:`, e instanceof Error ? e.message : e);
			return false;
		}
	}
	const done = await markRefunded(booking.id, refundId);
	if (done) {
		const found = await workshopUrl(booking.id);
		if (found) {
			await sendMail(
				seatRefundLetter(found.buyer.email, found.buyer.workshopTitle, formatMoney(booking.amountMinor, booking.currency), booking.refundReason ?? 'The booking was cancelled.', booking.id, found.publicUrl)
			).catch((e) => console.warn(`[payments] refund notice for booking ${booking.id} not sent:`, e instanceof Error ? e.message : e));
		}
	}
	return true;
}

/** Tries every due refund again (the provider was unreachable when it was asked); returns how many went through. */
export async function retryDueRefunds(): Promise<number> {
	if (!paymentsConfigured()) return 0;
	let done = 0;
	for (const due of await listDueRefunds()) if (await refundBooking(due)) done++;
	return done;
}

/**
 * Retries due refunds every `everyMs` (SQUARELAW_REFUND_RETRY_MINUTES, default 5) in this app server.
 * Every app server may run it: a refund's idempotency key is its booking, so two servers never refund twice.
 */
export function startRefundRetries(): () => void {
	const minutes = Number(env.SQUARELAW_REFUND_RETRY_MINUTES);
	const everyMs = (Number.isFinite(minutes) && minutes > 0 ? minutes : 5) * 60_000;
	const timer = setInterval(() => {
		retryDueRefunds().catch((e) => console.warn('[payments] retrying due refunds failed:', e instanceof Error ? e.message : e));
	}, everyMs);
	timer.unref();
	return () => clearInterval(timer);
}

export type WebhookAnswer = { status: number; message: string };

/**
 * A webhook from the provider. Its signature and timestamp are proved with the SDK's constructEvent;
 * a forged or replayed event is refused (400) and logged. Each event acts once (its id is stored with
 * the change it makes); events of types we do not use are acknowledged and ignored.
 */
export async function handlePaymentWebhook(payload: string, signature: string | null, from: string): Promise<WebhookAnswer> {
	let event: Stripe.Event;
	try {
		event = verifiedEvent(payload, signature);
	} catch (e) {
		// The SDK's message runs to several lines of advice; the first says what was wrong.
		console.warn(`[payments] webhook refused from ${from}: ${(e instanceof Error ? e.message : String(e)).split('\n')[0]}`);
		return { status: 400, message: 'The signature of this event could not be verified.' };
	}
	const ref = { id: event.id, type: event.type };
	if (event.type === 'checkout.session.completed' || event.type === 'checkout.session.async_payment_succeeded') {
		const session = event.data.object;
		const bookingId = session.client_reference_id ?? session.metadata?.bookingId ?? '';
		if (session.payment_status !== 'paid' || !isUuid(bookingId)) return { status: 200, message: 'ignored' };
		const result = await settle(bookingId, paymentIntentOf(session), ref);
		if (result.outcome === 'unknown') console.warn(`[payments] paid checkout ${session.id} names no booking of ours (${bookingId})`);
		return { status: 200, message: result.outcome };
	}
	if (event.type === 'checkout.session.expired') {
		await releaseExpiredCheckout(event.data.object.id, ref);
		return { status: 200, message: 'released' };
	}
	return { status: 200, message: 'ignored' };
}

export interface BookingRow {
	id: string;
	name: string | null;
	email: string;
	state: SeatBooking['state'];
	/** A hold whose time ran out reads as released. */
	shownState: 'held' | 'released' | 'confirmed' | 'refund_due' | 'refunded';
	amountMinor: number;
	currency: string;
	amount: string;
	bookedAt: string;
	paidAt: string | null;
	refundedAt: string | null;
	refundReason: string | null;
	paymentId: string | null;
	refundId: string | null;
}

/** The bookings, payments and refunds of a workshop, for those who keep its roster. Due refunds are retried first. */
export async function workshopBookings(user: SessionUser | null, workshopId: string): Promise<BookingRow[]> {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.roster');
	if (paymentsConfigured()) for (const due of await listDueRefunds(access.workshop.id)) await refundBooking(due);
	const rows = await listBookings(access.workshop.id);
	const now = Date.now();
	return rows.map(({ booking: b, name, email }) => ({
		id: b.id,
		name,
		email,
		state: b.state,
		shownState: b.state === 'held' && b.holdExpiresAt.getTime() <= now ? 'released' : b.state,
		amountMinor: b.amountMinor,
		currency: b.currency,
		amount: formatMoney(b.amountMinor, b.currency),
		bookedAt: b.createdAt.toISOString(),
		paidAt: b.paidAt?.toISOString() ?? null,
		refundedAt: b.refundedAt?.toISOString() ?? null,
		refundReason: b.refundReason,
		paymentId: b.paymentIntentId,
		refundId: b.refundId
	}));
}

/** An instructor cancels a paid seat: the student leaves the workshop and is refunded in full, and told. */
export async function cancelBookingWithRefund(user: SessionUser | null, workshopId: string, bookingId: string) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.roster');
	const booking = isUuid(bookingId) ? await cancelConfirmedBooking(access.workshop.id, bookingId) : null;
	if (!booking) throw new RuleViolation('That booking is not a paid seat of this workshop (already cancelled?).', 'booking');
	const refunded = await refundBooking(booking);
	return { refunded };
}

const CSV_COLUMNS = ['booking', 'name', 'email', 'state', 'amount', 'currency', 'booked_at', 'paid_at', 'refunded_at', 'refund_reason', 'payment_id', 'refund_id'];

/** A CSV field: quoted when it holds a separator, a quote or a line break; a leading formula sign is defused. */
function csvField(value: string | number | null): string {
	let text = value === null ? '' : String(value);
	if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`;
	return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The bookings as CSV (amounts in major units, times in UTC), for a spreadsheet or the club's accounts. */
export async function bookingsCsv(user: SessionUser | null, workshopId: string): Promise<{ filename: string; csv: string }> {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.roster');
	const rows = await workshopBookings(user, workshopId);
	const lines = rows.map((r) =>
		[r.id, r.name, r.email, r.shownState, toMajorText(r.amountMinor, r.currency), r.currency.toUpperCase(), r.bookedAt, r.paidAt, r.refundedAt, r.refundReason, r.paymentId, r.refundId]
			.map(csvField)
			.join(',')
	);
	return { filename: `bookings-${access.workshop.slug}.csv`, csv: [CSV_COLUMNS.join(','), ...lines].join('\r\n') + '\r\n' };
}
