CREATE TYPE "public"."part_kind" AS ENUM('stock_length', 'hardware', 'packaging');--> statement-breakpoint
CREATE TYPE "public"."offcut_status" AS ENUM('in_stock', 'reserved', 'used', 'scrapped');--> statement-breakpoint
CREATE TYPE "public"."stock_move_kind" AS ENUM('receive', 'adjust', 'reserve', 'release', 'consume', 'offcut_in', 'offcut_out', 'ship');--> statement-breakpoint
CREATE TYPE "public"."revision_status" AS ENUM('draft', 'released', 'retired');--> statement-breakpoint
CREATE TYPE "public"."display_unit" AS ENUM('in', 'mm');--> statement-breakpoint
CREATE TABLE "parts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"sku" text NOT NULL,
	"name" text NOT NULL,
	"kind" "part_kind" NOT NULL,
	"unit_of_measure" text DEFAULT 'each' NOT NULL,
	"unit_cost_cents" integer DEFAULT 0 NOT NULL,
	"weight_grams" integer DEFAULT 0 NOT NULL,
	"supplier" text,
	"lead_time_days" integer,
	"reorder_point" integer DEFAULT 0 NOT NULL,
	"reorder_quantity" integer DEFAULT 0 NOT NULL,
	"shelf_location" text,
	"nominal_size" text,
	"outside_diameter" integer,
	"stick_lengths" integer[] DEFAULT '{}'::integer[] NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "parts_sku_unique" UNIQUE("sku"),
	CONSTRAINT "parts_cost_not_negative" CHECK ("parts"."unit_cost_cents" >= 0),
	CONSTRAINT "parts_weight_not_negative" CHECK ("parts"."weight_grams" >= 0)
);
--> statement-breakpoint
CREATE TABLE "offcuts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"part_id" uuid NOT NULL,
	"length" integer NOT NULL,
	"status" "offcut_status" DEFAULT 'in_stock' NOT NULL,
	"note" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "offcuts_length_positive" CHECK ("offcuts"."length" > 0)
);
--> statement-breakpoint
CREATE TABLE "stock_moves" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"part_id" uuid NOT NULL,
	"kind" "stock_move_kind" NOT NULL,
	"quantity" integer NOT NULL,
	"stick_length" integer,
	"offcut_id" uuid,
	"work_order_id" uuid,
	"reason" text,
	"reference" text,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "stock_moves_quantity_not_zero" CHECK ("stock_moves"."quantity" <> 0),
	CONSTRAINT "stock_moves_sign_by_kind" CHECK (("stock_moves"."kind" in ('receive', 'offcut_in', 'reserve') and "stock_moves"."quantity" > 0)
        or ("stock_moves"."kind" in ('consume', 'offcut_out', 'ship', 'release') and "stock_moves"."quantity" < 0)
        or "stock_moves"."kind" = 'adjust'),
	CONSTRAINT "stock_moves_adjust_has_reason" CHECK ("stock_moves"."kind" <> 'adjust' or coalesce("stock_moves"."reason", '') <> '')
);
--> statement-breakpoint
CREATE TABLE "bom_lines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"revision_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"quantity" integer NOT NULL,
	"position" integer NOT NULL,
	"note" text,
	CONSTRAINT "bom_lines_quantity_positive" CHECK ("bom_lines"."quantity" > 0)
);
--> statement-breakpoint
CREATE TABLE "build_steps" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"revision_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"text" text NOT NULL,
	"caution" text,
	"photo_required" boolean DEFAULT false NOT NULL,
	"measurement_required" boolean DEFAULT false NOT NULL,
	"measurement_unit" text,
	"measurement_min" numeric,
	"measurement_max" numeric
);
--> statement-breakpoint
CREATE TABLE "cut_parts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"revision_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"frame_key" text,
	"label" text NOT NULL,
	"length" integer NOT NULL,
	"quantity" integer NOT NULL,
	"calculated_length" integer,
	"override_reason" text,
	"position" integer NOT NULL,
	CONSTRAINT "cut_parts_length_positive" CHECK ("cut_parts"."length" > 0),
	CONSTRAINT "cut_parts_quantity_positive" CHECK ("cut_parts"."quantity" > 0)
);
--> statement-breakpoint
CREATE TABLE "kit_revisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"kit_id" uuid NOT NULL,
	"code" text NOT NULL,
	"status" "revision_status" DEFAULT 'draft' NOT NULL,
	"notes" text,
	"frame_inputs" jsonb,
	"leak_test_min_pressure_pa" integer,
	"leak_test_max_pressure_pa" integer,
	"leak_test_hold_minutes" integer,
	"leak_test_max_drop_pa" integer,
	"leak_test_water_volume_ml" integer,
	"released_at" timestamp with time zone,
	"released_by" uuid,
	"retired_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "kit_revisions_kitId_code_unique" UNIQUE("kit_id","code")
);
--> statement-breakpoint
CREATE TABLE "kits" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"sku" text NOT NULL,
	"name" text NOT NULL,
	"store_product_id" text,
	"description" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "kits_sku_unique" UNIQUE("sku"),
	CONSTRAINT "kits_storeProductId_unique" UNIQUE("store_product_id")
);
--> statement-breakpoint
CREATE TABLE "shop_settings" (
	"id" integer PRIMARY KEY DEFAULT 1 NOT NULL,
	"shop_name" text NOT NULL,
	"display_unit" "display_unit" DEFAULT 'in' NOT NULL,
	"kerf" integer NOT NULL,
	"end_trim" integer NOT NULL,
	"min_offcut" integer NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "shop_settings_single_row" CHECK ("shop_settings"."id" = 1)
);
--> statement-breakpoint
ALTER TABLE "offcuts" ADD CONSTRAINT "offcuts_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_moves" ADD CONSTRAINT "stock_moves_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_moves" ADD CONSTRAINT "stock_moves_offcut_id_offcuts_id_fk" FOREIGN KEY ("offcut_id") REFERENCES "public"."offcuts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_moves" ADD CONSTRAINT "stock_moves_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bom_lines" ADD CONSTRAINT "bom_lines_revision_id_kit_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."kit_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bom_lines" ADD CONSTRAINT "bom_lines_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_steps" ADD CONSTRAINT "build_steps_revision_id_kit_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."kit_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_parts" ADD CONSTRAINT "cut_parts_revision_id_kit_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."kit_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_parts" ADD CONSTRAINT "cut_parts_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "kit_revisions" ADD CONSTRAINT "kit_revisions_kit_id_kits_id_fk" FOREIGN KEY ("kit_id") REFERENCES "public"."kits"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "kit_revisions" ADD CONSTRAINT "kit_revisions_released_by_users_id_fk" FOREIGN KEY ("released_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "parts_kind_index" ON "parts" USING btree ("kind");--> statement-breakpoint
CREATE INDEX "offcuts_part_id_status_index" ON "offcuts" USING btree ("part_id","status");--> statement-breakpoint
CREATE INDEX "stock_moves_part_id_kind_index" ON "stock_moves" USING btree ("part_id","kind");--> statement-breakpoint
CREATE INDEX "stock_moves_work_order_id_index" ON "stock_moves" USING btree ("work_order_id");--> statement-breakpoint
CREATE INDEX "stock_moves_created_at_index" ON "stock_moves" USING btree ("created_at");--> statement-breakpoint
CREATE INDEX "bom_lines_revision_id_index" ON "bom_lines" USING btree ("revision_id");--> statement-breakpoint
CREATE INDEX "build_steps_revision_id_index" ON "build_steps" USING btree ("revision_id");--> statement-breakpoint
CREATE INDEX "cut_parts_revision_id_index" ON "cut_parts" USING btree ("revision_id");--> statement-breakpoint
CREATE INDEX "kit_revisions_kit_id_status_index" ON "kit_revisions" USING btree ("kit_id","status");