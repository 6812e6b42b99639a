CREATE TABLE "flash_calibrations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"gear_id" uuid NOT NULL,
	"method" text NOT NULL,
	"guide_number_m" double precision NOT NULL,
	"rated_guide_number_m" double precision NOT NULL,
	"shot_id" uuid,
	"reading" jsonb NOT NULL,
	"created_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"undone_at" timestamp with time zone,
	CONSTRAINT "flash_calibrations_method_check" CHECK ("flash_calibrations"."method" in ('shot', 'meter'))
);
--> statement-breakpoint
CREATE TABLE "session_ticks" (
	"session_id" uuid NOT NULL,
	"item" text NOT NULL,
	"ticked_by_id" uuid,
	"ticked_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "session_ticks_session_id_item_pk" PRIMARY KEY("session_id","item")
);
--> statement-breakpoint
CREATE TABLE "shooting_sessions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"setup_id" uuid NOT NULL,
	"shot_on" text NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"created_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "shot_measures" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shot_id" uuid NOT NULL,
	"method" text NOT NULL,
	"region" jsonb,
	"mean_luminance" double precision,
	"meter" jsonb,
	"actual_offset_stops" double precision NOT NULL,
	"created_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "shot_measures_method_check" CHECK ("shot_measures"."method" in ('region', 'meter'))
);
--> statement-breakpoint
CREATE TABLE "shots" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"setup_id" uuid NOT NULL,
	"session_id" uuid,
	"revision_number" integer NOT NULL,
	"file_name" text NOT NULL,
	"content_type" text NOT NULL,
	"byte_size" integer NOT NULL,
	"width_px" integer NOT NULL,
	"height_px" integer NOT NULL,
	"original_key" text NOT NULL,
	"thumbnail_key" text NOT NULL,
	"preview_key" text NOT NULL,
	"exif" jsonb NOT NULL,
	"typed" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"taken_at" timestamp with time zone,
	"created_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"deleted_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "storage_leftovers" (
	"key" text PRIMARY KEY NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "studio_checklists" (
	"studio_id" uuid PRIMARY KEY NOT NULL,
	"items" text[] NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "flash_calibrations" ADD CONSTRAINT "flash_calibrations_gear_id_gear_id_fk" FOREIGN KEY ("gear_id") REFERENCES "public"."gear"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flash_calibrations" ADD CONSTRAINT "flash_calibrations_shot_id_shots_id_fk" FOREIGN KEY ("shot_id") REFERENCES "public"."shots"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flash_calibrations" ADD CONSTRAINT "flash_calibrations_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "session_ticks" ADD CONSTRAINT "session_ticks_session_id_shooting_sessions_id_fk" FOREIGN KEY ("session_id") REFERENCES "public"."shooting_sessions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "session_ticks" ADD CONSTRAINT "session_ticks_ticked_by_id_users_id_fk" FOREIGN KEY ("ticked_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shooting_sessions" ADD CONSTRAINT "shooting_sessions_setup_id_setups_id_fk" FOREIGN KEY ("setup_id") REFERENCES "public"."setups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shooting_sessions" ADD CONSTRAINT "shooting_sessions_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shot_measures" ADD CONSTRAINT "shot_measures_shot_id_shots_id_fk" FOREIGN KEY ("shot_id") REFERENCES "public"."shots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shot_measures" ADD CONSTRAINT "shot_measures_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shots" ADD CONSTRAINT "shots_setup_id_setups_id_fk" FOREIGN KEY ("setup_id") REFERENCES "public"."setups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shots" ADD CONSTRAINT "shots_session_id_shooting_sessions_id_fk" FOREIGN KEY ("session_id") REFERENCES "public"."shooting_sessions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shots" ADD CONSTRAINT "shots_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "studio_checklists" ADD CONSTRAINT "studio_checklists_studio_id_studios_id_fk" FOREIGN KEY ("studio_id") REFERENCES "public"."studios"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "flash_calibrations_gear_idx" ON "flash_calibrations" USING btree ("gear_id","created_at");--> statement-breakpoint
CREATE INDEX "shooting_sessions_setup_idx" ON "shooting_sessions" USING btree ("setup_id","shot_on");--> statement-breakpoint
CREATE INDEX "shot_measures_shot_idx" ON "shot_measures" USING btree ("shot_id","created_at");--> statement-breakpoint
CREATE INDEX "shots_setup_idx" ON "shots" USING btree ("setup_id","created_at");--> statement-breakpoint
CREATE INDEX "shots_session_idx" ON "shots" USING btree ("session_id");