ALTER TABLE "build_steps" ADD COLUMN "free_order" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "build_steps" ADD COLUMN "out_of_limits_rework" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "build_step_ticks" ADD COLUMN "out_of_limits_reason" text;--> statement-breakpoint
ALTER TABLE "rework_entries" ADD COLUMN "step_tick_id" uuid;--> statement-breakpoint
ALTER TABLE "rework_entries" ADD CONSTRAINT "rework_entries_step_tick_id_build_step_ticks_id_fk" FOREIGN KEY ("step_tick_id") REFERENCES "public"."build_step_ticks"("id") ON DELETE no action ON UPDATE no action;