CREATE TYPE "public"."return_decision" AS ENUM('repair', 'replace', 'refund');--> statement-breakpoint
CREATE TYPE "public"."return_label_status" AS ENUM('none', 'buying', 'bought');--> statement-breakpoint
CREATE TYPE "public"."return_status" AS ENUM('awaiting_parcel', 'received', 'repair', 'replace', 'refund');--> statement-breakpoint
ALTER TYPE "public"."order_source" ADD VALUE 'replacement';--> statement-breakpoint
CREATE SEQUENCE "public"."return_number_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1001 CACHE 1;--> statement-breakpoint
CREATE TABLE "return_photos" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"return_id" uuid NOT NULL,
	"key" text NOT NULL,
	"content_type" text NOT NULL,
	"size" integer NOT NULL,
	"uploaded_by" uuid NOT NULL,
	"uploaded_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "return_photos_key_unique" UNIQUE("key"),
	CONSTRAINT "return_photos_size_positive" CHECK ("return_photos"."size" > 0)
);
--> statement-breakpoint
CREATE TABLE "return_reasons" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"label" text NOT NULL,
	"position" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "return_reasons_label_unique" UNIQUE("label")
);
--> statement-breakpoint
CREATE TABLE "returns" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" text NOT NULL,
	"work_order_id" uuid NOT NULL,
	"order_id" uuid NOT NULL,
	"status" "return_status" DEFAULT 'awaiting_parcel' NOT NULL,
	"reason" text NOT NULL,
	"notes" text,
	"opened_by" uuid NOT NULL,
	"opened_at" timestamp with time zone DEFAULT now() NOT NULL,
	"label_status" "return_label_status" DEFAULT 'none' NOT NULL,
	"label_key" uuid,
	"label_request" jsonb,
	"carrier_ref" text,
	"carrier" text,
	"service" text,
	"tracking_number" text,
	"carrier_parcel_ref" text,
	"charge_cents" integer,
	"label_data" jsonb,
	"label_bought_at" timestamp with time zone,
	"label_bought_by" uuid,
	"received_at" timestamp with time zone,
	"received_by" uuid,
	"received_code" text,
	"decision" "return_decision",
	"decision_note" text,
	"decided_at" timestamp with time zone,
	"decided_by" uuid,
	"reopened_step_ids" uuid[],
	"rework_entry_id" uuid,
	"replacement_order_id" uuid,
	"replacement_work_order_id" uuid,
	"refund_cents" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "returns_number_unique" UNIQUE("number"),
	CONSTRAINT "returns_labelKey_unique" UNIQUE("label_key"),
	CONSTRAINT "returns_trackingNumber_unique" UNIQUE("tracking_number"),
	CONSTRAINT "returns_buying_has_key" CHECK ("returns"."label_status"::text = 'none' or "returns"."label_key" is not null),
	CONSTRAINT "returns_bought_has_tracking" CHECK ("returns"."label_status"::text <> 'bought' or "returns"."tracking_number" is not null),
	CONSTRAINT "returns_decided_has_decision" CHECK ("returns"."status"::text in ('awaiting_parcel', 'received') = ("returns"."decision" is null)),
	CONSTRAINT "returns_refund_not_negative" CHECK ("returns"."refund_cents" is null or "returns"."refund_cents" >= 0)
);
--> statement-breakpoint
ALTER TABLE "return_photos" ADD CONSTRAINT "return_photos_return_id_returns_id_fk" FOREIGN KEY ("return_id") REFERENCES "public"."returns"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "return_photos" ADD CONSTRAINT "return_photos_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_order_id_orders_id_fk" FOREIGN KEY ("order_id") REFERENCES "public"."orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_opened_by_users_id_fk" FOREIGN KEY ("opened_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_label_bought_by_users_id_fk" FOREIGN KEY ("label_bought_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_received_by_users_id_fk" FOREIGN KEY ("received_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_decided_by_users_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_rework_entry_id_rework_entries_id_fk" FOREIGN KEY ("rework_entry_id") REFERENCES "public"."rework_entries"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_replacement_order_id_orders_id_fk" FOREIGN KEY ("replacement_order_id") REFERENCES "public"."orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "returns" ADD CONSTRAINT "returns_replacement_work_order_id_work_orders_id_fk" FOREIGN KEY ("replacement_work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "return_photos_return_id_index" ON "return_photos" USING btree ("return_id");--> statement-breakpoint
CREATE INDEX "returns_work_order_id_index" ON "returns" USING btree ("work_order_id");--> statement-breakpoint
CREATE INDEX "returns_order_id_index" ON "returns" USING btree ("order_id");--> statement-breakpoint
CREATE INDEX "returns_status_opened_at_index" ON "returns" USING btree ("status","opened_at");--> statement-breakpoint
CREATE UNIQUE INDEX "returns_one_undecided_per_unit" ON "returns" USING btree ("work_order_id") WHERE "returns"."status" in ('awaiting_parcel', 'received');