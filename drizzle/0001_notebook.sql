-- pg_trgm ships with PostgreSQL (contrib) and is a trusted extension: the database owner may create it.
CREATE EXTENSION IF NOT EXISTS pg_trgm;--> statement-breakpoint
CREATE TABLE "setup_revisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"setup_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"parent_number" integer,
	"restored_from_number" integer,
	"document" jsonb NOT NULL,
	"title" text NOT NULL,
	"subject" text DEFAULT '' NOT NULL,
	"tags" text[] DEFAULT '{}'::text[] NOT NULL,
	"author_id" uuid,
	"message" text DEFAULT '' NOT NULL,
	"thumbnail_png" "bytea",
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "setups" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"studio_id" uuid NOT NULL,
	"title" text NOT NULL,
	"subject" text DEFAULT '' NOT NULL,
	"tags" text[] DEFAULT '{}'::text[] NOT NULL,
	"latest_revision" integer DEFAULT 1 NOT NULL,
	"derived_from_setup_id" uuid,
	"derived_from_revision" integer,
	"gear_ids" uuid[] DEFAULT '{}'::uuid[] NOT NULL,
	"thumbnail_revision" integer,
	"search_text" text DEFAULT '' NOT NULL,
	"created_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"deleted_at" timestamp with time zone,
	"deleted_by_id" uuid
);
--> statement-breakpoint
CREATE TABLE "studio_setup_counts" (
	"studio_id" uuid PRIMARY KEY NOT NULL,
	"live" integer DEFAULT 0 NOT NULL,
	"trashed" integer DEFAULT 0 NOT NULL
);
--> statement-breakpoint
CREATE TABLE "gear" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"studio_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"name" text NOT NULL,
	"spec" jsonb NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"created_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"retired_at" timestamp with time zone,
	CONSTRAINT "gear_kind_check" CHECK ("gear"."kind" in ('flash', 'modifier', 'reflector', 'lens', 'camera'))
);
--> statement-breakpoint
ALTER TABLE "setup_revisions" ADD CONSTRAINT "setup_revisions_setup_id_setups_id_fk" FOREIGN KEY ("setup_id") REFERENCES "public"."setups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "setup_revisions" ADD CONSTRAINT "setup_revisions_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "setups" ADD CONSTRAINT "setups_studio_id_studios_id_fk" FOREIGN KEY ("studio_id") REFERENCES "public"."studios"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "setups" ADD CONSTRAINT "setups_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "setups" ADD CONSTRAINT "setups_deleted_by_id_users_id_fk" FOREIGN KEY ("deleted_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "setups" ADD CONSTRAINT "setups_derived_from_fk" FOREIGN KEY ("derived_from_setup_id") REFERENCES "public"."setups"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "gear" ADD CONSTRAINT "gear_studio_id_studios_id_fk" FOREIGN KEY ("studio_id") REFERENCES "public"."studios"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "gear" ADD CONSTRAINT "gear_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "setup_revisions_setup_number_idx" ON "setup_revisions" USING btree ("setup_id","number");--> statement-breakpoint
CREATE INDEX "setups_studio_updated_idx" ON "setups" USING btree ("studio_id","updated_at","id") WHERE "setups"."deleted_at" is null;--> statement-breakpoint
CREATE INDEX "setups_studio_title_idx" ON "setups" USING btree ("studio_id","title","id") WHERE "setups"."deleted_at" is null;--> statement-breakpoint
CREATE INDEX "setups_studio_trash_idx" ON "setups" USING btree ("studio_id","deleted_at") WHERE "setups"."deleted_at" is not null;--> statement-breakpoint
CREATE INDEX "setups_derived_from_idx" ON "setups" USING btree ("derived_from_setup_id");--> statement-breakpoint
CREATE INDEX "setups_tags_idx" ON "setups" USING gin ("tags");--> statement-breakpoint
CREATE INDEX "setups_gear_ids_idx" ON "setups" USING gin ("gear_ids");--> statement-breakpoint
CREATE INDEX "setups_search_trgm_idx" ON "setups" USING gin ("search_text" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "gear_studio_kind_name_idx" ON "gear" USING btree ("studio_id","kind","name");--> statement-breakpoint
-- Written by hand (drizzle-kit does not generate triggers): studio_setup_counts follows every insert,
-- delete and change of studio or trash state on setups, one upsert per studio per statement.
CREATE FUNCTION setups_apply_count_delta() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF TG_OP = 'INSERT' THEN
		INSERT INTO studio_setup_counts AS c (studio_id, live, trashed)
		SELECT studio_id, count(*) FILTER (WHERE deleted_at IS NULL), count(*) FILTER (WHERE deleted_at IS NOT NULL)
		FROM new_rows GROUP BY studio_id
		ON CONFLICT (studio_id) DO UPDATE SET live = c.live + excluded.live, trashed = c.trashed + excluded.trashed;
	ELSIF TG_OP = 'DELETE' THEN
		UPDATE studio_setup_counts AS c SET live = c.live - d.live, trashed = c.trashed - d.trashed
		FROM (SELECT studio_id, count(*) FILTER (WHERE deleted_at IS NULL) AS live, count(*) FILTER (WHERE deleted_at IS NOT NULL) AS trashed
			FROM old_rows GROUP BY studio_id) AS d
		WHERE c.studio_id = d.studio_id;
	ELSE
		INSERT INTO studio_setup_counts AS c (studio_id, live, trashed)
		SELECT studio_id, sum(live), sum(trashed) FROM (
			SELECT studio_id, CASE WHEN deleted_at IS NULL THEN 1 ELSE 0 END AS live, CASE WHEN deleted_at IS NULL THEN 0 ELSE 1 END AS trashed FROM new_rows
			UNION ALL
			SELECT studio_id, CASE WHEN deleted_at IS NULL THEN -1 ELSE 0 END, CASE WHEN deleted_at IS NULL THEN 0 ELSE -1 END FROM old_rows
		) AS delta GROUP BY studio_id
		HAVING sum(live) <> 0 OR sum(trashed) <> 0
		ON CONFLICT (studio_id) DO UPDATE SET live = c.live + excluded.live, trashed = c.trashed + excluded.trashed;
	END IF;
	RETURN NULL;
END $$;--> statement-breakpoint
CREATE TRIGGER setups_count_insert AFTER INSERT ON setups REFERENCING NEW TABLE AS new_rows
	FOR EACH STATEMENT EXECUTE FUNCTION setups_apply_count_delta();--> statement-breakpoint
CREATE TRIGGER setups_count_delete AFTER DELETE ON setups REFERENCING OLD TABLE AS old_rows
	FOR EACH STATEMENT EXECUTE FUNCTION setups_apply_count_delta();--> statement-breakpoint
CREATE TRIGGER setups_count_update AFTER UPDATE ON setups REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
	FOR EACH STATEMENT EXECUTE FUNCTION setups_apply_count_delta();
