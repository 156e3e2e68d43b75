CREATE TYPE "public"."label_status" AS ENUM('bought', 'voided');--> statement-breakpoint
ALTER TYPE "public"."shipment_status" ADD VALUE 'buying' BEFORE 'labelled';--> statement-breakpoint
CREATE TABLE "carrier_events" (
	"id" text PRIMARY KEY NOT NULL,
	"tracking_number" text NOT NULL,
	"status" text NOT NULL,
	"body" jsonb NOT NULL,
	"shipment_id" uuid,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "shipping_labels" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shipment_id" uuid NOT NULL,
	"idempotency_key" uuid NOT NULL,
	"status" "label_status" DEFAULT 'bought' NOT NULL,
	"carrier" text NOT NULL,
	"service" text NOT NULL,
	"carrier_ref" text NOT NULL,
	"tracking_numbers" text[] NOT NULL,
	"carrier_parcel_refs" text[] NOT NULL,
	"charge_cents" integer NOT NULL,
	"bought_at" timestamp with time zone DEFAULT now() NOT NULL,
	"bought_by" uuid,
	"void_reason" text,
	"voided_at" timestamp with time zone,
	"voided_by" uuid,
	"refund_status" text,
	CONSTRAINT "shipping_labels_idempotencyKey_unique" UNIQUE("idempotency_key"),
	CONSTRAINT "shipping_labels_void_has_reason" CHECK ("shipping_labels"."status"::text <> 'voided' or "shipping_labels"."void_reason" is not null)
);
--> statement-breakpoint
ALTER TABLE "shipments" DROP CONSTRAINT "shipments_labelled_has_tracking";--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "carrier_name" text;--> statement-breakpoint
ALTER TABLE "parcels" ADD COLUMN "tracking_number" text;--> statement-breakpoint
ALTER TABLE "shipments" ADD COLUMN "label_key" uuid;--> statement-breakpoint
ALTER TABLE "shipments" ADD COLUMN "label_request" jsonb;--> statement-breakpoint
ALTER TABLE "shipments" ADD COLUMN "carrier_ref" text;--> statement-breakpoint
ALTER TABLE "shipments" ADD COLUMN "tracking_status" text;--> statement-breakpoint
ALTER TABLE "shipments" ADD COLUMN "tracking_updated_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "shipments" ADD COLUMN "delivered_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "carrier_events" ADD CONSTRAINT "carrier_events_shipment_id_shipments_id_fk" FOREIGN KEY ("shipment_id") REFERENCES "public"."shipments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipping_labels" ADD CONSTRAINT "shipping_labels_shipment_id_shipments_id_fk" FOREIGN KEY ("shipment_id") REFERENCES "public"."shipments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipping_labels" ADD CONSTRAINT "shipping_labels_bought_by_users_id_fk" FOREIGN KEY ("bought_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipping_labels" ADD CONSTRAINT "shipping_labels_voided_by_users_id_fk" FOREIGN KEY ("voided_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "shipping_labels_shipment_id_index" ON "shipping_labels" USING btree ("shipment_id");--> statement-breakpoint
ALTER TABLE "parcels" ADD CONSTRAINT "parcels_trackingNumber_unique" UNIQUE("tracking_number");--> statement-breakpoint
ALTER TABLE "shipments" ADD CONSTRAINT "shipments_labelKey_unique" UNIQUE("label_key");--> statement-breakpoint
ALTER TABLE "shipments" ADD CONSTRAINT "shipments_buying_has_key" CHECK ("shipments"."status"::text <> 'buying' or "shipments"."label_key" is not null);--> statement-breakpoint
ALTER TABLE "shipments" ADD CONSTRAINT "shipments_labelled_has_tracking" CHECK ("shipments"."status"::text in ('packing', 'buying') or "shipments"."tracking_number" is not null);