CREATE TABLE "exercise_starts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"exercise_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"setup_id" uuid NOT NULL,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "exercises" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workshop_id" uuid NOT NULL,
	"lesson_id" uuid NOT NULL,
	"title" text NOT NULL,
	"brief" text DEFAULT '' NOT NULL,
	"setup_id" uuid NOT NULL,
	"revision_number" integer NOT NULL,
	"due_at" timestamp with time zone NOT NULL,
	"targets" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"created_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "hand_ins" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"exercise_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"setup_id" uuid NOT NULL,
	"revision_number" integer NOT NULL,
	"shot_ids" uuid[] DEFAULT '{}'::uuid[] NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"late" boolean NOT NULL,
	"targets" jsonb NOT NULL,
	"target_results" jsonb NOT NULL,
	"targets_met" integer NOT NULL,
	"handed_in_at" timestamp with time zone DEFAULT now() NOT NULL,
	"state" text DEFAULT 'handed-in' NOT NULL,
	"feedback" text DEFAULT '' NOT NULL,
	"reviewed_by_id" uuid,
	"reviewed_at" timestamp with time zone,
	CONSTRAINT "hand_ins_state_check" CHECK ("hand_ins"."state" in ('handed-in', 'accepted', 'another-try'))
);
--> statement-breakpoint
ALTER TABLE "exercise_starts" ADD CONSTRAINT "exercise_starts_exercise_id_exercises_id_fk" FOREIGN KEY ("exercise_id") REFERENCES "public"."exercises"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exercise_starts" ADD CONSTRAINT "exercise_starts_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exercise_starts" ADD CONSTRAINT "exercise_starts_setup_id_setups_id_fk" FOREIGN KEY ("setup_id") REFERENCES "public"."setups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exercises" ADD CONSTRAINT "exercises_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exercises" ADD CONSTRAINT "exercises_lesson_id_workshop_lessons_id_fk" FOREIGN KEY ("lesson_id") REFERENCES "public"."workshop_lessons"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exercises" ADD CONSTRAINT "exercises_setup_id_setups_id_fk" FOREIGN KEY ("setup_id") REFERENCES "public"."setups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exercises" ADD CONSTRAINT "exercises_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exercises" ADD CONSTRAINT "exercises_revision_fk" FOREIGN KEY ("setup_id","revision_number") REFERENCES "public"."setup_revisions"("setup_id","number") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "hand_ins" ADD CONSTRAINT "hand_ins_exercise_id_exercises_id_fk" FOREIGN KEY ("exercise_id") REFERENCES "public"."exercises"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "hand_ins" ADD CONSTRAINT "hand_ins_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "hand_ins" ADD CONSTRAINT "hand_ins_setup_id_setups_id_fk" FOREIGN KEY ("setup_id") REFERENCES "public"."setups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "hand_ins" ADD CONSTRAINT "hand_ins_reviewed_by_id_users_id_fk" FOREIGN KEY ("reviewed_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "hand_ins" ADD CONSTRAINT "hand_ins_revision_fk" FOREIGN KEY ("setup_id","revision_number") REFERENCES "public"."setup_revisions"("setup_id","number") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "exercise_starts_exercise_user_idx" ON "exercise_starts" USING btree ("exercise_id","user_id");--> statement-breakpoint
CREATE UNIQUE INDEX "exercise_starts_setup_idx" ON "exercise_starts" USING btree ("setup_id");--> statement-breakpoint
CREATE INDEX "exercises_workshop_idx" ON "exercises" USING btree ("workshop_id","due_at");--> statement-breakpoint
CREATE INDEX "exercises_lesson_idx" ON "exercises" USING btree ("lesson_id");--> statement-breakpoint
CREATE UNIQUE INDEX "hand_ins_version_idx" ON "hand_ins" USING btree ("exercise_id","user_id","version");--> statement-breakpoint
CREATE INDEX "hand_ins_user_idx" ON "hand_ins" USING btree ("user_id");