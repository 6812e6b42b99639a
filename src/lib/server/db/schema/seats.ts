// Paid seats: a booking of a seat in a workshop, from the hold while its buyer is at checkout to the
// payment that confirms it or the refund that returns it, and the payment provider's events already
// handled (so a repeated event changes nothing).
import { sql } from 'drizzle-orm';
import { check, index, integer, pgTable, text, uniqueIndex } from 'drizzle-orm/pg-core';
import { belongsTo, inList, optionalRef, timestamps, timestamptz, uuidKey, writtenAt } from './columns';
import { users } from './auth';
import { workshops } from './workshops';

/**
 * held: a seat kept for the buyer until `holdExpiresAt` (counted only until then);
 * released: the hold ended (expired, cancelled, or the checkout could not start), nothing was paid;
 * confirmed: paid, and the buyer is a student of the workshop;
 * refund_due: paid but no seat for it (or cancelled by an instructor): the refund is being made;
 * refunded: the payment was returned.
 */
export const BOOKING_STATES = ['held', 'released', 'confirmed', 'refund_due', 'refunded'] as const;
export type BookingState = (typeof BOOKING_STATES)[number];

export const seatBookings = pgTable(
	'seat_bookings',
	{
		id: uuidKey(),
		workshopId: belongsTo(() => workshops.id),
		userId: belongsTo(() => users.id),
		state: text().$type<BookingState>().notNull().default('held'),
		/** The price when booked, in minor units, and its currency. */
		amountMinor: integer().notNull(),
		currency: text().notNull(),
		holdExpiresAt: timestamptz().notNull(),
		/** The provider's checkout session, once it is made. */
		checkoutSessionId: text().unique(),
		checkoutUrl: text(),
		paymentIntentId: text().unique(),
		paidAt: timestamptz(),
		refundId: text(),
		refundedAt: timestamptz(),
		/** Why the payment is (being) returned, in words for the buyer. */
		refundReason: text(),
		...timestamps()
	},
	(t) => [
		index('seat_bookings_workshop_idx').on(t.workshopId, t.state),
		// One open hold or confirmed seat per person and workshop: a second click reuses the first.
		uniqueIndex('seat_bookings_active_idx')
			.on(t.workshopId, t.userId)
			.where(sql`${t.state} in ('held', 'confirmed')`),
		check('seat_bookings_state_check', inList(t.state, BOOKING_STATES)),
		check('seat_bookings_amount_check', sql`${t.amountMinor} > 0`)
	]
);

/** Each provider event handled once: its id is the key, so a repeated delivery is seen and skipped. */
export const paymentEvents = pgTable('payment_events', {
	id: text().primaryKey(),
	type: text().notNull(),
	bookingId: optionalRef(() => seatBookings.id),
	receivedAt: writtenAt()
});

export type SeatBooking = typeof seatBookings.$inferSelect;
export type NewSeatBooking = typeof seatBookings.$inferInsert;
