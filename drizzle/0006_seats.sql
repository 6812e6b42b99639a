CREATE TABLE "payment_events" (
	"id" text PRIMARY KEY NOT NULL,
	"type" text NOT NULL,
	"booking_id" uuid,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "seat_bookings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workshop_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"state" text DEFAULT 'held' NOT NULL,
	"amount_minor" integer NOT NULL,
	"currency" text NOT NULL,
	"hold_expires_at" timestamp with time zone NOT NULL,
	"checkout_session_id" text,
	"checkout_url" text,
	"payment_intent_id" text,
	"paid_at" timestamp with time zone,
	"refund_id" text,
	"refunded_at" timestamp with time zone,
	"refund_reason" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "seat_bookings_checkoutSessionId_unique" UNIQUE("checkout_session_id"),
	CONSTRAINT "seat_bookings_paymentIntentId_unique" UNIQUE("payment_intent_id"),
	CONSTRAINT "seat_bookings_state_check" CHECK ("seat_bookings"."state" in ('held', 'released', 'confirmed', 'refund_due', 'refunded')),
	CONSTRAINT "seat_bookings_amount_check" CHECK ("seat_bookings"."amount_minor" > 0)
);
--> statement-breakpoint
ALTER TABLE "workshops" ADD COLUMN "price_minor" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "workshops" ADD COLUMN "currency" text DEFAULT 'eur' NOT NULL;--> statement-breakpoint
ALTER TABLE "payment_events" ADD CONSTRAINT "payment_events_booking_id_seat_bookings_id_fk" FOREIGN KEY ("booking_id") REFERENCES "public"."seat_bookings"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "seat_bookings" ADD CONSTRAINT "seat_bookings_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "seat_bookings" ADD CONSTRAINT "seat_bookings_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "seat_bookings_workshop_idx" ON "seat_bookings" USING btree ("workshop_id","state");--> statement-breakpoint
CREATE UNIQUE INDEX "seat_bookings_active_idx" ON "seat_bookings" USING btree ("workshop_id","user_id") WHERE "seat_bookings"."state" in ('held', 'confirmed');--> statement-breakpoint
ALTER TABLE "workshops" ADD CONSTRAINT "workshops_price_check" CHECK ("workshops"."price_minor" >= 0);