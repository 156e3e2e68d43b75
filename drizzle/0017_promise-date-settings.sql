ALTER TABLE "shop_settings" ADD COLUMN "workday_start_hour_utc" integer DEFAULT 8 NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "workday_hours" integer DEFAULT 8 NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "cut_minutes_per_unit" integer DEFAULT 15 NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "build_minutes_per_unit" integer DEFAULT 60 NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "pack_minutes_per_unit" integer DEFAULT 15 NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD CONSTRAINT "shop_settings_workday_range" CHECK ("shop_settings"."workday_start_hour_utc" between 0 and 23 and "shop_settings"."workday_hours" between 1 and 24);--> statement-breakpoint
ALTER TABLE "shop_settings" ADD CONSTRAINT "shop_settings_minutes_per_unit_range" CHECK ("shop_settings"."cut_minutes_per_unit" between 1 and 1440 and "shop_settings"."build_minutes_per_unit" between 1 and 1440 and "shop_settings"."pack_minutes_per_unit" between 1 and 1440);