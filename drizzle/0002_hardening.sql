ALTER TABLE "sessions" ADD COLUMN "created_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "access_tokens" ADD COLUMN "expires_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "access_tokens" ADD COLUMN "scope" text DEFAULT 'read-write' NOT NULL;--> statement-breakpoint
CREATE INDEX "sessions_user_idx" ON "sessions" USING btree ("user_id");--> statement-breakpoint
ALTER TABLE "access_tokens" ADD CONSTRAINT "access_tokens_scope_check" CHECK ("access_tokens"."scope" in ('read-only', 'read-write'));--> statement-breakpoint
-- Written by hand: session rows now hold the SHA-256 (hex) of the cookie's token. Sessions open at
-- migration time are hashed in place, so nobody is signed out; their created_at is the migration's
-- time, so the 30-day absolute limit counts from now for them.
UPDATE "sessions" SET "session_token" = encode(sha256(convert_to("session_token", 'UTF8')), 'hex');
