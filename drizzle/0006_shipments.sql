CREATE TYPE "public"."dim_weight_system" AS ENUM('in3_per_lb', 'cm3_per_kg');--> statement-breakpoint
CREATE TYPE "public"."pack_check_method" AS ENUM('scan', 'tick');--> statement-breakpoint
CREATE TYPE "public"."shipment_status" AS ENUM('packing', 'labelled', 'shipped');--> statement-breakpoint
CREATE SEQUENCE "public"."sscc_serial_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1;--> statement-breakpoint
CREATE TABLE "boxes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"part_id" uuid,
	"length" integer NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"weight_grams" integer NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "boxes_code_unique" UNIQUE("code"),
	CONSTRAINT "boxes_size_positive" CHECK ("boxes"."length" > 0 and "boxes"."width" > 0 and "boxes"."height" > 0),
	CONSTRAINT "boxes_weight_not_negative" CHECK ("boxes"."weight_grams" >= 0)
);
--> statement-breakpoint
CREATE TABLE "pack_checks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shipment_id" uuid NOT NULL,
	"work_order_id" uuid NOT NULL,
	"item_key" text NOT NULL,
	"method" "pack_check_method" NOT NULL,
	"code" text,
	"checked_by" uuid NOT NULL,
	"checked_at" timestamp with time zone DEFAULT now() NOT NULL,
	"undone_at" timestamp with time zone,
	"undone_by" uuid
);
--> statement-breakpoint
CREATE TABLE "parcels" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shipment_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"box_id" uuid,
	"box_name" text NOT NULL,
	"length" integer NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"work_order_ids" uuid[] NOT NULL,
	"estimated_grams" integer NOT NULL,
	"scale_grams" integer,
	"actual_grams" integer NOT NULL,
	"dimensional_grams" integer NOT NULL,
	"billable_grams" integer NOT NULL,
	"sscc" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "parcels_sscc_unique" UNIQUE("sscc"),
	CONSTRAINT "parcels_shipmentId_position_unique" UNIQUE("shipment_id","position"),
	CONSTRAINT "parcels_weights_positive" CHECK ("parcels"."actual_grams" > 0 and "parcels"."billable_grams" >= "parcels"."actual_grams" and "parcels"."billable_grams" >= "parcels"."dimensional_grams"),
	CONSTRAINT "parcels_sscc_18_digits" CHECK ("parcels"."sscc" ~ '^[0-9]{18}$')
);
--> statement-breakpoint
CREATE TABLE "shipments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"order_id" uuid NOT NULL,
	"status" "shipment_status" DEFAULT 'packing' NOT NULL,
	"carrier" text,
	"service" text,
	"tracking_number" text,
	"charge_cents" integer,
	"label_data" jsonb,
	"labelled_at" timestamp with time zone,
	"labelled_by" uuid,
	"partial_approved_at" timestamp with time zone,
	"partial_approved_by" uuid,
	"partial_note" text,
	"shipped_at" timestamp with time zone,
	"shipped_by" uuid,
	"created_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "shipments_trackingNumber_unique" UNIQUE("tracking_number"),
	CONSTRAINT "shipments_labelled_has_tracking" CHECK ("shipments"."status" = 'packing' or "shipments"."tracking_number" is not null)
);
--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "dim_weight_divisor" integer DEFAULT 139 NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "dim_weight_system" "dim_weight_system" DEFAULT 'in3_per_lb' NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "sender_name" text;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "sender_line1" text;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "sender_line2" text;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "sender_city" text;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "sender_region" text;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "sender_postal_code" text;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "sender_country" text;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "sender_phone" text;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "gs1_company_prefix" text;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "sscc_extension_digit" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "boxes" ADD CONSTRAINT "boxes_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pack_checks" ADD CONSTRAINT "pack_checks_shipment_id_shipments_id_fk" FOREIGN KEY ("shipment_id") REFERENCES "public"."shipments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pack_checks" ADD CONSTRAINT "pack_checks_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pack_checks" ADD CONSTRAINT "pack_checks_checked_by_users_id_fk" FOREIGN KEY ("checked_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pack_checks" ADD CONSTRAINT "pack_checks_undone_by_users_id_fk" FOREIGN KEY ("undone_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "parcels" ADD CONSTRAINT "parcels_shipment_id_shipments_id_fk" FOREIGN KEY ("shipment_id") REFERENCES "public"."shipments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "parcels" ADD CONSTRAINT "parcels_box_id_boxes_id_fk" FOREIGN KEY ("box_id") REFERENCES "public"."boxes"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipments" ADD CONSTRAINT "shipments_order_id_orders_id_fk" FOREIGN KEY ("order_id") REFERENCES "public"."orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipments" ADD CONSTRAINT "shipments_labelled_by_users_id_fk" FOREIGN KEY ("labelled_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipments" ADD CONSTRAINT "shipments_partial_approved_by_users_id_fk" FOREIGN KEY ("partial_approved_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipments" ADD CONSTRAINT "shipments_shipped_by_users_id_fk" FOREIGN KEY ("shipped_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipments" ADD CONSTRAINT "shipments_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "pack_checks_shipment_id_index" ON "pack_checks" USING btree ("shipment_id");--> statement-breakpoint
CREATE UNIQUE INDEX "pack_checks_one_standing" ON "pack_checks" USING btree ("shipment_id","item_key") WHERE "pack_checks"."undone_at" is null;--> statement-breakpoint
CREATE INDEX "shipments_order_id_index" ON "shipments" USING btree ("order_id");--> statement-breakpoint
CREATE UNIQUE INDEX "shipments_one_open_per_order" ON "shipments" USING btree ("order_id") WHERE "shipments"."status" <> 'shipped';