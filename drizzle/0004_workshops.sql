CREATE TABLE "workshop_invitations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workshop_id" uuid NOT NULL,
	"email" text NOT NULL,
	"role" text DEFAULT 'student' NOT NULL,
	"token_hash" text NOT NULL,
	"invited_by_id" uuid,
	"expires_at" timestamp with time zone NOT NULL,
	"accepted_at" timestamp with time zone,
	"accepted_by_id" uuid,
	"revoked_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "workshop_invitations_tokenHash_unique" UNIQUE("token_hash"),
	CONSTRAINT "workshop_invitations_role_check" CHECK ("workshop_invitations"."role" in ('instructor', 'student'))
);
--> statement-breakpoint
CREATE TABLE "workshop_join_requests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workshop_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"message" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"decision" text,
	"decided_at" timestamp with time zone,
	"decided_by_id" uuid,
	CONSTRAINT "workshop_join_requests_decision_check" CHECK ("workshop_join_requests"."decision" is null or "workshop_join_requests"."decision" in ('accepted', 'declined'))
);
--> statement-breakpoint
CREATE TABLE "workshop_lessons" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workshop_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"title" text NOT NULL,
	"student_notes" text DEFAULT '' NOT NULL,
	"presenter_notes" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "workshop_members" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workshop_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"role" text NOT NULL,
	"joined_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_seen_at" timestamp with time zone,
	CONSTRAINT "workshop_members_role_check" CHECK ("workshop_members"."role" in ('instructor', 'student'))
);
--> statement-breakpoint
CREATE TABLE "workshop_sessions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workshop_id" uuid NOT NULL,
	"starts_at" timestamp with time zone NOT NULL,
	"ends_at" timestamp with time zone NOT NULL,
	"place" text NOT NULL,
	CONSTRAINT "workshop_sessions_order_check" CHECK ("workshop_sessions"."ends_at" > "workshop_sessions"."starts_at")
);
--> statement-breakpoint
CREATE TABLE "workshop_steps" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lesson_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"setup_id" uuid NOT NULL,
	"revision_number" integer NOT NULL,
	"hidden_element_ids" text[] DEFAULT '{}'::text[] NOT NULL,
	"caption" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "workshops" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"studio_id" uuid NOT NULL,
	"slug" text NOT NULL,
	"title" text NOT NULL,
	"summary" text DEFAULT '' NOT NULL,
	"capacity" integer NOT NULL,
	"state" text DEFAULT 'draft' NOT NULL,
	"live_lesson_id" uuid,
	"live_step_id" uuid,
	"live_updated_at" timestamp with time zone,
	"created_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "workshops_slug_unique" UNIQUE("slug"),
	CONSTRAINT "workshops_state_check" CHECK ("workshops"."state" in ('draft', 'published', 'archived')),
	CONSTRAINT "workshops_capacity_check" CHECK ("workshops"."capacity" between 1 and 10000)
);
--> statement-breakpoint
ALTER TABLE "workshop_invitations" ADD CONSTRAINT "workshop_invitations_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshop_invitations" ADD CONSTRAINT "workshop_invitations_invited_by_id_users_id_fk" FOREIGN KEY ("invited_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshop_invitations" ADD CONSTRAINT "workshop_invitations_accepted_by_id_users_id_fk" FOREIGN KEY ("accepted_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshop_join_requests" ADD CONSTRAINT "workshop_join_requests_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshop_join_requests" ADD CONSTRAINT "workshop_join_requests_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshop_join_requests" ADD CONSTRAINT "workshop_join_requests_decided_by_id_users_id_fk" FOREIGN KEY ("decided_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshop_lessons" ADD CONSTRAINT "workshop_lessons_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshop_members" ADD CONSTRAINT "workshop_members_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshop_members" ADD CONSTRAINT "workshop_members_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshop_sessions" ADD CONSTRAINT "workshop_sessions_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshop_steps" ADD CONSTRAINT "workshop_steps_lesson_id_workshop_lessons_id_fk" FOREIGN KEY ("lesson_id") REFERENCES "public"."workshop_lessons"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshop_steps" ADD CONSTRAINT "workshop_steps_setup_id_setups_id_fk" FOREIGN KEY ("setup_id") REFERENCES "public"."setups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshop_steps" ADD CONSTRAINT "workshop_steps_revision_fk" FOREIGN KEY ("setup_id","revision_number") REFERENCES "public"."setup_revisions"("setup_id","number") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshops" ADD CONSTRAINT "workshops_studio_id_studios_id_fk" FOREIGN KEY ("studio_id") REFERENCES "public"."studios"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshops" ADD CONSTRAINT "workshops_live_lesson_id_workshop_lessons_id_fk" FOREIGN KEY ("live_lesson_id") REFERENCES "public"."workshop_lessons"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshops" ADD CONSTRAINT "workshops_live_step_id_workshop_steps_id_fk" FOREIGN KEY ("live_step_id") REFERENCES "public"."workshop_steps"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "workshops" ADD CONSTRAINT "workshops_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "workshop_invitations_workshop_idx" ON "workshop_invitations" USING btree ("workshop_id");--> statement-breakpoint
CREATE UNIQUE INDEX "workshop_join_requests_open_idx" ON "workshop_join_requests" USING btree ("workshop_id","user_id") WHERE "workshop_join_requests"."decision" is null;--> statement-breakpoint
CREATE INDEX "workshop_lessons_workshop_idx" ON "workshop_lessons" USING btree ("workshop_id","position");--> statement-breakpoint
CREATE UNIQUE INDEX "workshop_members_workshop_user_idx" ON "workshop_members" USING btree ("workshop_id","user_id");--> statement-breakpoint
CREATE INDEX "workshop_members_user_idx" ON "workshop_members" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "workshop_sessions_workshop_idx" ON "workshop_sessions" USING btree ("workshop_id","starts_at");--> statement-breakpoint
CREATE INDEX "workshop_steps_lesson_idx" ON "workshop_steps" USING btree ("lesson_id","position");--> statement-breakpoint
CREATE INDEX "workshop_steps_setup_idx" ON "workshop_steps" USING btree ("setup_id");--> statement-breakpoint
CREATE INDEX "workshops_studio_idx" ON "workshops" USING btree ("studio_id");