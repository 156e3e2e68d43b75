ALTER TABLE "parts" ADD COLUMN "electrical" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "mail_from_name" text;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "mail_from_address" text;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "reply_to_address" text;