CREATE TYPE "public"."payment_link_status" AS ENUM('creating', 'open', 'paid', 'failed');--> statement-breakpoint
CREATE TYPE "public"."payment_method" AS ENUM('card_by_phone', 'cash', 'bank_transfer', 'payment_link');--> statement-breakpoint
CREATE SEQUENCE "public"."offcut_code_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1;--> statement-breakpoint
CREATE TABLE "order_payments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"order_id" uuid NOT NULL,
	"method" "payment_method" NOT NULL,
	"amount_cents" integer NOT NULL,
	"reference" text,
	"external_id" text,
	"recorded_by" uuid,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "order_payments_externalId_unique" UNIQUE("external_id"),
	CONSTRAINT "order_payments_amount_positive" CHECK ("order_payments"."amount_cents" > 0)
);
--> statement-breakpoint
CREATE TABLE "payment_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"event_id" text NOT NULL,
	"type" text NOT NULL,
	"payload" jsonb NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "payment_events_eventId_unique" UNIQUE("event_id")
);
--> statement-breakpoint
CREATE TABLE "payment_links" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"order_id" uuid NOT NULL,
	"idempotency_key" text NOT NULL,
	"status" "payment_link_status" DEFAULT 'creating' NOT NULL,
	"amount_cents" integer NOT NULL,
	"external_id" text,
	"url" text,
	"error" text,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"paid_at" timestamp with time zone,
	CONSTRAINT "payment_links_idempotencyKey_unique" UNIQUE("idempotency_key"),
	CONSTRAINT "payment_links_externalId_unique" UNIQUE("external_id"),
	CONSTRAINT "payment_links_amount_positive" CHECK ("payment_links"."amount_cents" > 0)
);
--> statement-breakpoint
ALTER TABLE "offcuts" ADD COLUMN "code" text DEFAULT 'OC-' || lpad(nextval('offcut_code_seq')::text, 6, '0') NOT NULL;--> statement-breakpoint
ALTER TABLE "kits" ADD COLUMN "price_cents" integer;--> statement-breakpoint
ALTER TABLE "order_payments" ADD CONSTRAINT "order_payments_order_id_orders_id_fk" FOREIGN KEY ("order_id") REFERENCES "public"."orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "order_payments" ADD CONSTRAINT "order_payments_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payment_links" ADD CONSTRAINT "payment_links_order_id_orders_id_fk" FOREIGN KEY ("order_id") REFERENCES "public"."orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payment_links" ADD CONSTRAINT "payment_links_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "order_payments_order_id_index" ON "order_payments" USING btree ("order_id");--> statement-breakpoint
CREATE INDEX "payment_links_order_id_index" ON "payment_links" USING btree ("order_id");--> statement-breakpoint
ALTER TABLE "offcuts" ADD CONSTRAINT "offcuts_code_unique" UNIQUE("code");