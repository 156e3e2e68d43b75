CREATE TYPE "public"."leak_place" AS ENUM('sprayer', 'drain_grommet', 'riser_joint', 'cord_hole', 'other');--> statement-breakpoint
CREATE TYPE "public"."pressure_unit" AS ENUM('psi', 'kPa');--> statement-breakpoint
CREATE TABLE "build_step_ticks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"work_order_id" uuid NOT NULL,
	"build_step_id" uuid NOT NULL,
	"ticked_by" uuid NOT NULL,
	"ticked_at" timestamp with time zone DEFAULT now() NOT NULL,
	"measurement" numeric,
	"out_of_limits" boolean DEFAULT false NOT NULL,
	"undone_at" timestamp with time zone,
	"undone_by" uuid,
	CONSTRAINT "build_step_ticks_undo_has_who" CHECK (("build_step_ticks"."undone_at" is null) = ("build_step_ticks"."undone_by" is null))
);
--> statement-breakpoint
CREATE TABLE "leak_tests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"work_order_id" uuid NOT NULL,
	"attempt" integer NOT NULL,
	"start_pressure_pa" integer NOT NULL,
	"end_pressure_pa" integer NOT NULL,
	"hold_minutes" integer NOT NULL,
	"water_volume_ml" integer NOT NULL,
	"leaks" "leak_place"[] DEFAULT '{}' NOT NULL,
	"leak_note" text,
	"entered_unit" "pressure_unit" NOT NULL,
	"passed" boolean NOT NULL,
	"reason" text,
	"tested_by" uuid NOT NULL,
	"tested_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "leak_tests_workOrderId_attempt_unique" UNIQUE("work_order_id","attempt"),
	CONSTRAINT "leak_tests_attempt_positive" CHECK ("leak_tests"."attempt" > 0)
);
--> statement-breakpoint
CREATE TABLE "rework_entries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"work_order_id" uuid NOT NULL,
	"leak_test_id" uuid,
	"reason" text NOT NULL,
	"created_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"resolved_at" timestamp with time zone,
	"resolved_by" uuid
);
--> statement-breakpoint
CREATE TABLE "unit_photos" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"work_order_id" uuid NOT NULL,
	"build_step_id" uuid,
	"key" text NOT NULL,
	"content_type" text NOT NULL,
	"size" integer NOT NULL,
	"uploaded_by" uuid NOT NULL,
	"uploaded_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "unit_photos_key_unique" UNIQUE("key"),
	CONSTRAINT "unit_photos_size_positive" CHECK ("unit_photos"."size" > 0)
);
--> statement-breakpoint
ALTER TABLE "build_step_ticks" ADD CONSTRAINT "build_step_ticks_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_step_ticks" ADD CONSTRAINT "build_step_ticks_build_step_id_build_steps_id_fk" FOREIGN KEY ("build_step_id") REFERENCES "public"."build_steps"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_step_ticks" ADD CONSTRAINT "build_step_ticks_ticked_by_users_id_fk" FOREIGN KEY ("ticked_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_step_ticks" ADD CONSTRAINT "build_step_ticks_undone_by_users_id_fk" FOREIGN KEY ("undone_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "leak_tests" ADD CONSTRAINT "leak_tests_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "leak_tests" ADD CONSTRAINT "leak_tests_tested_by_users_id_fk" FOREIGN KEY ("tested_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rework_entries" ADD CONSTRAINT "rework_entries_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rework_entries" ADD CONSTRAINT "rework_entries_leak_test_id_leak_tests_id_fk" FOREIGN KEY ("leak_test_id") REFERENCES "public"."leak_tests"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rework_entries" ADD CONSTRAINT "rework_entries_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rework_entries" ADD CONSTRAINT "rework_entries_resolved_by_users_id_fk" FOREIGN KEY ("resolved_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_photos" ADD CONSTRAINT "unit_photos_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_photos" ADD CONSTRAINT "unit_photos_build_step_id_build_steps_id_fk" FOREIGN KEY ("build_step_id") REFERENCES "public"."build_steps"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_photos" ADD CONSTRAINT "unit_photos_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "build_step_ticks_work_order_id_index" ON "build_step_ticks" USING btree ("work_order_id");--> statement-breakpoint
CREATE UNIQUE INDEX "build_step_ticks_one_standing" ON "build_step_ticks" USING btree ("work_order_id","build_step_id") WHERE "build_step_ticks"."undone_at" is null;--> statement-breakpoint
CREATE INDEX "rework_entries_work_order_id_index" ON "rework_entries" USING btree ("work_order_id");--> statement-breakpoint
CREATE INDEX "unit_photos_work_order_id_index" ON "unit_photos" USING btree ("work_order_id");