ALTER TABLE "parts" ADD COLUMN "hs_code" text;--> statement-breakpoint
ALTER TABLE "parts" ADD COLUMN "origin_country" text;--> statement-breakpoint
ALTER TABLE "parts" ADD COLUMN "customs_description" text;--> statement-breakpoint
ALTER TABLE "parts" ADD CONSTRAINT "parts_hs_code_digits" CHECK ("parts"."hs_code" ~ '^[0-9]{6,10}$');--> statement-breakpoint
ALTER TABLE "parts" ADD CONSTRAINT "parts_origin_country_alpha2" CHECK ("parts"."origin_country" ~ '^[A-Z]{2}$');