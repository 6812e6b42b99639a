ALTER TABLE "flash_calibrations" DROP CONSTRAINT "flash_calibrations_method_check";--> statement-breakpoint
ALTER TABLE "flash_calibrations" ADD CONSTRAINT "flash_calibrations_method_check" CHECK ("flash_calibrations"."method" in ('shot', 'meter', 'typed'));--> statement-breakpoint
-- A flash's calibration is now one figure, its spec.calibrationOffsetStops, and flash_calibrations its
-- whole history. An offset typed on the shelf before this migration becomes the first entry of that
-- history, dated when the flash was added, so undoing a later calibration returns to it.
INSERT INTO "flash_calibrations" ("gear_id", "method", "guide_number_m", "rated_guide_number_m", "reading", "created_by_id", "created_at")
SELECT "id", 'typed',
	("spec"->>'guideNumberM')::double precision * power(2, ("spec"->>'calibrationOffsetStops')::double precision / 2),
	("spec"->>'guideNumberM')::double precision,
	jsonb_build_object('typedOffsetStops', ("spec"->'calibrationOffsetStops')),
	"created_by_id", "created_at"
FROM "gear"
WHERE "kind" = 'flash' AND jsonb_typeof("spec"->'calibrationOffsetStops') = 'number' AND ("spec"->>'calibrationOffsetStops')::double precision <> 0
	AND jsonb_typeof("spec"->'guideNumberM') = 'number';--> statement-breakpoint
-- A calibration from a shot or a meter in force becomes the flash's offset: 2·log2(measured / rated) stops.
UPDATE "gear" SET "spec" = jsonb_set("gear"."spec", '{calibrationOffsetStops}', to_jsonb(2 * ln(c."guide_number_m" / c."rated_guide_number_m") / ln(2)))
FROM (
	SELECT DISTINCT ON ("gear_id") "gear_id", "guide_number_m", "rated_guide_number_m"
	FROM "flash_calibrations" WHERE "undone_at" IS NULL AND "method" <> 'typed'
	ORDER BY "gear_id", "created_at" DESC
) c
WHERE "gear"."id" = c."gear_id";
