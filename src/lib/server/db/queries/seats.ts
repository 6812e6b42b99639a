// Named queries of paid seats. Every change of a booking runs in one transaction that first locks the
// workshop's row (SELECT … FOR UPDATE), then the booking's: two buyers, a webhook and an instructor
// never count the same free seat, and the lock order is always the same, so they never deadlock.
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { db, type Tx } from '../index';
import { paymentEvents, seatBookings, users, workshopMembers, workshops, type SeatBooking } from '../schema';
import { countSeatsTaken } from './workshops';

async function lockWorkshop(tx: Tx, workshopId: string) {
	const [w] = await tx.select().from(workshops).where(eq(workshops.id, workshopId)).for('update');
	return w ?? null;
}

async function memberRole(tx: Tx, workshopId: string, userId: string) {
	const [m] = await tx
		.select({ role: workshopMembers.role })
		.from(workshopMembers)
		.where(and(eq(workshopMembers.workshopId, workshopId), eq(workshopMembers.userId, userId)));
	return m?.role ?? null;
}

export type HoldOutcome =
	| { outcome: 'new'; booking: SeatBooking }
	| { outcome: 'held'; booking: SeatBooking }
	| { outcome: 'not-open'; state: string }
	| { outcome: 'opening' }
	| { outcome: 'free' }
	| { outcome: 'member' }
	| { outcome: 'full' }
	| { outcome: 'gone' };

/**
 * Holds a seat for a buyer until `holdMs` from now: refused when the workshop is not published, free,
 * full, or the buyer is already in it. A buyer whose hold is still running gets that hold back (a
 * second click starts no second checkout).
 */
export async function holdSeat(workshopId: string, userId: string, holdMs: number): Promise<HoldOutcome> {
	return db.transaction(async (tx) => {
		const w = await lockWorkshop(tx, workshopId);
		if (!w) return { outcome: 'gone' as const };
		if (w.state !== 'published') return { outcome: 'not-open' as const, state: w.state };
		if (w.priceMinor <= 0) return { outcome: 'free' as const };
		if (await memberRole(tx, workshopId, userId)) return { outcome: 'member' as const };
		const [active] = await tx
			.select()
			.from(seatBookings)
			.where(and(eq(seatBookings.workshopId, workshopId), eq(seatBookings.userId, userId), inArray(seatBookings.state, ['held', 'confirmed'])))
			.for('update');
		if (active?.state === 'confirmed') return { outcome: 'member' as const };
		if (active && active.holdExpiresAt.getTime() > Date.now()) {
			// A running hold: its checkout, or (a second click while the first is still being made) a wait.
			return active.checkoutUrl ? { outcome: 'held' as const, booking: active } : { outcome: 'opening' as const };
		}
		// A hold that ran out makes way for the new one.
		if (active) await tx.update(seatBookings).set({ state: 'released', updatedAt: new Date() }).where(eq(seatBookings.id, active.id));
		if ((await countSeatsTaken(workshopId, tx)).taken >= w.capacity) return { outcome: 'full' as const };
		const [booking] = await tx
			.insert(seatBookings)
			.values({ workshopId, userId, state: 'held', amountMinor: w.priceMinor, currency: w.currency, holdExpiresAt: new Date(Date.now() + holdMs) })
			.returning();
		return { outcome: 'new' as const, booking };
	});
}

export async function attachCheckout(bookingId: string, checkoutSessionId: string, checkoutUrl: string) {
	await db.update(seatBookings).set({ checkoutSessionId, checkoutUrl, updatedAt: new Date() }).where(eq(seatBookings.id, bookingId));
}

/** Ends a hold that was not paid (expired, cancelled, or its checkout could not start); false when it was not held. */
export async function releaseHold(bookingId: string): Promise<boolean> {
	const rows = await db
		.update(seatBookings)
		.set({ state: 'released', updatedAt: new Date() })
		.where(and(eq(seatBookings.id, bookingId), eq(seatBookings.state, 'held')))
		.returning({ id: seatBookings.id });
	return rows.length > 0;
}

export async function findBooking(bookingId: string) {
	const [row] = await db.select().from(seatBookings).where(eq(seatBookings.id, bookingId));
	return row ?? null;
}

export async function findBookingByCheckout(checkoutSessionId: string) {
	const [row] = await db.select().from(seatBookings).where(eq(seatBookings.checkoutSessionId, checkoutSessionId));
	return row ?? null;
}

/** Notes a provider event as handled, inside the transaction that acts on it; false when it was already. */
async function firstTimeSeen(tx: Tx, event: { id: string; type: string } | null, bookingId: string | null) {
	if (!event) return true;
	const rows = await tx.insert(paymentEvents).values({ id: event.id, type: event.type, bookingId }).onConflictDoNothing().returning({ id: paymentEvents.id });
	return rows.length > 0;
}

export type SettleOutcome =
	| { outcome: 'confirmed' | 'refund'; booking: SeatBooking }
	| { outcome: 'duplicate' | 'already' | 'unknown' };

export const REFUND_REASONS = {
	full: 'The hold on your seat ran out before the payment arrived, and the workshop filled up in the meantime.',
	member: 'You were already in this workshop, so this payment was not needed.',
	cancelled: 'The instructor cancelled your booking.'
} as const;

/**
 * A paid checkout: confirms the booking (the buyer becomes a student) when its hold is still running,
 * or, once it ran out, when a seat is still free; otherwise marks the payment for refund. Runs once per
 * event (`event` null: the buyer's return from checkout, which the booking's state makes idempotent),
 * whatever order events arrive in: a booking released by an expiry that came first is still settled.
 */
export async function settlePaidCheckout(bookingId: string, paymentIntentId: string, event: { id: string; type: string } | null): Promise<SettleOutcome> {
	const first = await findBooking(bookingId);
	if (!first) {
		await db.transaction((tx) => firstTimeSeen(tx, event, null));
		return { outcome: 'unknown' };
	}
	return db.transaction(async (tx): Promise<SettleOutcome> => {
		const w = await lockWorkshop(tx, first.workshopId);
		if (!(await firstTimeSeen(tx, event, first.id))) return { outcome: 'duplicate' };
		const [b] = await tx.select().from(seatBookings).where(eq(seatBookings.id, first.id)).for('update');
		if (!w || !b) return { outcome: 'unknown' };
		if (b.state !== 'held' && b.state !== 'released') return { outcome: 'already' };
		const paid = { paymentIntentId, paidAt: new Date(), updatedAt: new Date() };
		const refund = async (reason: string) => {
			const [row] = await tx.update(seatBookings).set({ ...paid, state: 'refund_due', refundReason: reason }).where(eq(seatBookings.id, b.id)).returning();
			return { outcome: 'refund' as const, booking: row };
		};
		const [otherSeat] = await tx
			.select({ id: seatBookings.id })
			.from(seatBookings)
			.where(and(eq(seatBookings.workshopId, b.workshopId), eq(seatBookings.userId, b.userId), eq(seatBookings.state, 'confirmed')));
		if (otherSeat || (await memberRole(tx, b.workshopId, b.userId))) return refund(REFUND_REASONS.member);
		const holdRunning = b.state === 'held' && b.holdExpiresAt.getTime() > Date.now();
		if (!holdRunning && (await countSeatsTaken(b.workshopId, tx, b.id)).taken >= w.capacity) return refund(REFUND_REASONS.full);
		// Another booking of the same buyer may hold the active slot (a second checkout after this one lapsed).
		await tx
			.update(seatBookings)
			.set({ state: 'released', updatedAt: new Date() })
			.where(and(eq(seatBookings.workshopId, b.workshopId), eq(seatBookings.userId, b.userId), eq(seatBookings.state, 'held'), sql`${seatBookings.id} <> ${b.id}`));
		const [row] = await tx.update(seatBookings).set({ ...paid, state: 'confirmed' }).where(eq(seatBookings.id, b.id)).returning();
		await tx.insert(workshopMembers).values({ workshopId: b.workshopId, userId: b.userId, role: 'student' }).onConflictDoNothing();
		return { outcome: 'confirmed', booking: row };
	});
}

/** An expired checkout (provider event): its hold ends unless it was paid. Once per event. */
export async function releaseExpiredCheckout(checkoutSessionId: string, event: { id: string; type: string }) {
	const booking = await findBookingByCheckout(checkoutSessionId);
	return db.transaction(async (tx) => {
		if (booking) await lockWorkshop(tx, booking.workshopId);
		if (!(await firstTimeSeen(tx, event, booking?.id ?? null)) || !booking) return false;
		const rows = await tx
			.update(seatBookings)
			.set({ state: 'released', updatedAt: new Date() })
			.where(and(eq(seatBookings.id, booking.id), eq(seatBookings.state, 'held')))
			.returning({ id: seatBookings.id });
		return rows.length > 0;
	});
}

/** An instructor's cancellation of a paid seat: the student leaves the workshop and the payment is due back. */
export async function cancelConfirmedBooking(workshopId: string, bookingId: string): Promise<SeatBooking | null> {
	return db.transaction(async (tx) => {
		await lockWorkshop(tx, workshopId);
		const [b] = await tx
			.select()
			.from(seatBookings)
			.where(and(eq(seatBookings.id, bookingId), eq(seatBookings.workshopId, workshopId)))
			.for('update');
		if (!b || b.state !== 'confirmed') return null;
		const [row] = await tx
			.update(seatBookings)
			.set({ state: 'refund_due', refundReason: REFUND_REASONS.cancelled, updatedAt: new Date() })
			.where(eq(seatBookings.id, b.id))
			.returning();
		await tx
			.delete(workshopMembers)
			.where(and(eq(workshopMembers.workshopId, workshopId), eq(workshopMembers.userId, b.userId), eq(workshopMembers.role, 'student')));
		return row;
	});
}

export async function markRefunded(bookingId: string, refundId: string | null) {
	const rows = await db
		.update(seatBookings)
		.set({ state: 'refunded', refundId, refundedAt: new Date(), updatedAt: new Date() })
		.where(and(eq(seatBookings.id, bookingId), eq(seatBookings.state, 'refund_due')))
		.returning();
	return rows[0] ?? null;
}

/** Payments still to be returned, one workshop's or every workshop's (a refund call that failed is tried again from here). */
export async function listDueRefunds(workshopId?: string) {
	const due = eq(seatBookings.state, 'refund_due');
	return db.select().from(seatBookings).where(workshopId ? and(eq(seatBookings.workshopId, workshopId), due) : due);
}

/** Every booking of a workshop with its buyer, oldest first (the roster's payments and the CSV). */
export async function listBookings(workshopId: string) {
	return db
		.select({ booking: seatBookings, name: users.name, email: users.email })
		.from(seatBookings)
		.innerJoin(users, eq(users.id, seatBookings.userId))
		.where(eq(seatBookings.workshopId, workshopId))
		.orderBy(asc(seatBookings.createdAt));
}

export async function buyerOf(bookingId: string) {
	const [row] = await db
		.select({ email: users.email, name: users.name, workshopTitle: workshops.title, slug: workshops.slug, workshopId: workshops.id })
		.from(seatBookings)
		.innerJoin(users, eq(users.id, seatBookings.userId))
		.innerJoin(workshops, eq(workshops.id, seatBookings.workshopId))
		.where(eq(seatBookings.id, bookingId));
	return row ?? null;
}

export async function setPrice(workshopId: string, priceMinor: number, currency: string) {
	await db.update(workshops).set({ priceMinor, currency, updatedAt: new Date() }).where(eq(workshops.id, workshopId));
}

export async function findWorkshopBySlug(slug: string) {
	const [row] = await db.select().from(workshops).where(eq(workshops.slug, slug));
	return row ?? null;
}
