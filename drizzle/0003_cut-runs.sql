CREATE TYPE "public"."cut_run_status" AS ENUM('draft', 'published', 'done', 'cancelled');--> statement-breakpoint
CREATE TYPE "public"."cut_status" AS ENUM('pending', 'cut', 'replanned');--> statement-breakpoint
CREATE TYPE "public"."cut_stick_status" AS ENUM('pending', 'in_progress', 'done', 'damaged');--> statement-breakpoint
CREATE TYPE "public"."plan_status" AS ENUM('optimal', 'feasible', 'time-limit');--> statement-breakpoint
CREATE TYPE "public"."bin_status" AS ENUM('free', 'in_use');--> statement-breakpoint
CREATE SEQUENCE "public"."cut_run_number_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1;--> statement-breakpoint
CREATE TABLE "cut_run_cuts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"cut_run_id" uuid NOT NULL,
	"stick_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"offset" integer NOT NULL,
	"length" integer NOT NULL,
	"work_order_id" uuid NOT NULL,
	"cut_part_id" uuid NOT NULL,
	"status" "cut_status" DEFAULT 'pending' NOT NULL,
	"cut_by" uuid,
	"cut_at" timestamp with time zone,
	"replaces_cut_id" uuid,
	CONSTRAINT "cut_run_cuts_length_positive" CHECK ("cut_run_cuts"."length" > 0)
);
--> statement-breakpoint
CREATE TABLE "cut_run_sticks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"cut_run_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"stick_length" integer,
	"source_offcut_id" uuid,
	"length" integer NOT NULL,
	"trim" integer DEFAULT 0 NOT NULL,
	"pattern_index" integer NOT NULL,
	"position" integer NOT NULL,
	"status" "cut_stick_status" DEFAULT 'pending' NOT NULL,
	"remnant" integer NOT NULL,
	"remnant_is_offcut" boolean NOT NULL,
	"offcut_id" uuid,
	"replan_of_stick_id" uuid,
	"started_by" uuid,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	"damaged_reason" text,
	"damaged_by" uuid,
	"damaged_at" timestamp with time zone,
	CONSTRAINT "cut_run_sticks_one_source" CHECK (("cut_run_sticks"."stick_length" is null) <> ("cut_run_sticks"."source_offcut_id" is null)),
	CONSTRAINT "cut_run_sticks_length_positive" CHECK ("cut_run_sticks"."length" > 0)
);
--> statement-breakpoint
CREATE TABLE "cut_runs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" text NOT NULL,
	"status" "cut_run_status" DEFAULT 'draft' NOT NULL,
	"kerf" integer NOT NULL,
	"end_trim" integer NOT NULL,
	"min_offcut" integer NOT NULL,
	"plan_status" "plan_status" NOT NULL,
	"stock_cost" bigint DEFAULT 0 NOT NULL,
	"lower_bound_cost" bigint DEFAULT 0 NOT NULL,
	"sticks_used" integer DEFAULT 0 NOT NULL,
	"lower_bound_sticks" integer DEFAULT 0 NOT NULL,
	"offcuts_used" integer DEFAULT 0 NOT NULL,
	"offcuts_made" integer DEFAULT 0 NOT NULL,
	"length_used" bigint DEFAULT 0 NOT NULL,
	"piece_length" bigint DEFAULT 0 NOT NULL,
	"kerf_loss" bigint DEFAULT 0 NOT NULL,
	"trim_loss" bigint DEFAULT 0 NOT NULL,
	"offcut_length" bigint DEFAULT 0 NOT NULL,
	"scrap_length" bigint DEFAULT 0 NOT NULL,
	"solve_ms" integer DEFAULT 0 NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"published_by" uuid,
	"published_at" timestamp with time zone,
	"completed_at" timestamp with time zone,
	"cancelled_at" timestamp with time zone,
	CONSTRAINT "cut_runs_number_unique" UNIQUE("number")
);
--> statement-breakpoint
CREATE TABLE "bins" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"code" text NOT NULL,
	"status" "bin_status" DEFAULT 'free' NOT NULL,
	"work_order_id" uuid,
	"assigned_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "bins_code_unique" UNIQUE("code")
);
--> statement-breakpoint
ALTER TABLE "cut_run_cuts" ADD CONSTRAINT "cut_run_cuts_cut_run_id_cut_runs_id_fk" FOREIGN KEY ("cut_run_id") REFERENCES "public"."cut_runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_run_cuts" ADD CONSTRAINT "cut_run_cuts_stick_id_cut_run_sticks_id_fk" FOREIGN KEY ("stick_id") REFERENCES "public"."cut_run_sticks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_run_cuts" ADD CONSTRAINT "cut_run_cuts_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_run_cuts" ADD CONSTRAINT "cut_run_cuts_cut_part_id_cut_parts_id_fk" FOREIGN KEY ("cut_part_id") REFERENCES "public"."cut_parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_run_cuts" ADD CONSTRAINT "cut_run_cuts_cut_by_users_id_fk" FOREIGN KEY ("cut_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_run_sticks" ADD CONSTRAINT "cut_run_sticks_cut_run_id_cut_runs_id_fk" FOREIGN KEY ("cut_run_id") REFERENCES "public"."cut_runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_run_sticks" ADD CONSTRAINT "cut_run_sticks_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_run_sticks" ADD CONSTRAINT "cut_run_sticks_source_offcut_id_offcuts_id_fk" FOREIGN KEY ("source_offcut_id") REFERENCES "public"."offcuts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_run_sticks" ADD CONSTRAINT "cut_run_sticks_offcut_id_offcuts_id_fk" FOREIGN KEY ("offcut_id") REFERENCES "public"."offcuts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_run_sticks" ADD CONSTRAINT "cut_run_sticks_started_by_users_id_fk" FOREIGN KEY ("started_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_run_sticks" ADD CONSTRAINT "cut_run_sticks_damaged_by_users_id_fk" FOREIGN KEY ("damaged_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_runs" ADD CONSTRAINT "cut_runs_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_runs" ADD CONSTRAINT "cut_runs_published_by_users_id_fk" FOREIGN KEY ("published_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bins" ADD CONSTRAINT "bins_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "cut_run_cuts_stick_id_position_index" ON "cut_run_cuts" USING btree ("stick_id","position");--> statement-breakpoint
CREATE INDEX "cut_run_cuts_cut_run_id_index" ON "cut_run_cuts" USING btree ("cut_run_id");--> statement-breakpoint
CREATE INDEX "cut_run_cuts_work_order_id_status_index" ON "cut_run_cuts" USING btree ("work_order_id","status");--> statement-breakpoint
CREATE INDEX "cut_run_sticks_cut_run_id_position_index" ON "cut_run_sticks" USING btree ("cut_run_id","position");--> statement-breakpoint
CREATE INDEX "cut_runs_status_created_at_index" ON "cut_runs" USING btree ("status","created_at");--> statement-breakpoint
CREATE INDEX "bins_status_index" ON "bins" USING btree ("status");--> statement-breakpoint
CREATE UNIQUE INDEX "bins_one_per_work_order" ON "bins" USING btree ("work_order_id") WHERE "bins"."work_order_id" is not null;