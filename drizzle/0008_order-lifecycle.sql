CREATE TYPE "public"."order_priority" AS ENUM('normal', 'rush');--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "lead_time_days" integer DEFAULT 7 NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "auto_release_paid" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "orders" ADD COLUMN "priority" "order_priority" DEFAULT 'normal' NOT NULL;--> statement-breakpoint
ALTER TABLE "orders" ADD COLUMN "held_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "orders" ADD COLUMN "hold_reason" text;--> statement-breakpoint
ALTER TABLE "orders" ADD COLUMN "held_by" uuid;--> statement-breakpoint
ALTER TABLE "orders" ADD CONSTRAINT "orders_held_by_users_id_fk" FOREIGN KEY ("held_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD CONSTRAINT "shop_settings_lead_time_days_range" CHECK ("shop_settings"."lead_time_days" between 0 and 250);