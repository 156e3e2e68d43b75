CREATE TYPE "public"."spread_source" AS ENUM('singles', 'typed');--> statement-breakpoint
CREATE TYPE "public"."weight_source" AS ENUM('typed', 'scale');--> statement-breakpoint
CREATE TABLE "bag_weighings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"request_key" uuid,
	"order_id" uuid NOT NULL,
	"work_order_id" uuid NOT NULL,
	"item_key" text NOT NULL,
	"measured_mg" integer NOT NULL,
	"entered_as" text NOT NULL,
	"source" "weight_source" NOT NULL,
	"expected_mg" integer NOT NULL,
	"tolerance_mg" integer NOT NULL,
	"difference_mg" integer NOT NULL,
	"accepted" boolean NOT NULL,
	"contents" jsonb NOT NULL,
	"explanations" jsonb NOT NULL,
	"words" text NOT NULL,
	"weighed_by" uuid NOT NULL,
	"weighed_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "bag_weighings_requestKey_unique" UNIQUE("request_key"),
	CONSTRAINT "bag_weighings_measured_not_negative" CHECK ("bag_weighings"."measured_mg" >= 0 and "bag_weighings"."tolerance_mg" >= 0 and "bag_weighings"."expected_mg" > 0)
);
--> statement-breakpoint
CREATE TABLE "unit_weight_samples" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"part_id" uuid NOT NULL,
	"sample_count" integer NOT NULL,
	"sample_mg" integer NOT NULL,
	"unit_mg" integer NOT NULL,
	"spread_mg" integer NOT NULL,
	"spread_source" "spread_source" NOT NULL,
	"singles_mg" integer[] DEFAULT '{}'::integer[] NOT NULL,
	"packed_loose" boolean DEFAULT false NOT NULL,
	"recorded_by" uuid NOT NULL,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "unit_weight_samples_count_positive" CHECK ("unit_weight_samples"."sample_count" > 0),
	CONSTRAINT "unit_weight_samples_weights_positive" CHECK ("unit_weight_samples"."sample_mg" > 0 and "unit_weight_samples"."unit_mg" > 0 and "unit_weight_samples"."spread_mg" >= 0)
);
--> statement-breakpoint
ALTER TABLE "bag_weighings" ADD CONSTRAINT "bag_weighings_order_id_orders_id_fk" FOREIGN KEY ("order_id") REFERENCES "public"."orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bag_weighings" ADD CONSTRAINT "bag_weighings_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bag_weighings" ADD CONSTRAINT "bag_weighings_weighed_by_users_id_fk" FOREIGN KEY ("weighed_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_weight_samples" ADD CONSTRAINT "unit_weight_samples_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_weight_samples" ADD CONSTRAINT "unit_weight_samples_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "bag_weighings_work_order_id_item_key_weighed_at_index" ON "bag_weighings" USING btree ("work_order_id","item_key","weighed_at");--> statement-breakpoint
CREATE INDEX "bag_weighings_order_id_index" ON "bag_weighings" USING btree ("order_id");--> statement-breakpoint
CREATE INDEX "unit_weight_samples_part_id_recorded_at_index" ON "unit_weight_samples" USING btree ("part_id","recorded_at");