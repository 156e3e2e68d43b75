CREATE TYPE "public"."return_disposition" AS ENUM('spare', 'scrapped');--> statement-breakpoint
ALTER TABLE "returns" ADD COLUMN "disposition" "return_disposition";--> statement-breakpoint
ALTER TABLE "returns" ADD COLUMN "disposition_note" text;--> statement-breakpoint
ALTER TABLE "returns" ADD COLUMN "disposed_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "returns" ADD COLUMN "disposed_by" uuid;--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_disposed_by_users_id_fk" FOREIGN KEY ("disposed_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_disposition_after_replace_or_refund" CHECK ("returns"."disposition" is null or "returns"."status"::text in ('replace', 'refund'));--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_disposition_complete" CHECK (("returns"."disposition" is null) = ("returns"."disposed_at" is null) and ("returns"."disposition" is null) = ("returns"."disposed_by" is null));--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_scrap_has_reason" CHECK ("returns"."disposition"::text is distinct from 'scrapped' or "returns"."disposition_note" is not null);