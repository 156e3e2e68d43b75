CREATE INDEX "order_events_payment" ON "order_events" USING btree ("order_id","created_at") WHERE "order_events"."kind" = 'payment';--> statement-breakpoint
CREATE INDEX "build_step_ticks_standing_at" ON "build_step_ticks" USING btree ("ticked_at","work_order_id") WHERE "build_step_ticks"."undone_at" is null;--> statement-breakpoint
CREATE INDEX "leak_tests_tested_at_work_order_id_index" ON "leak_tests" USING btree ("tested_at","work_order_id");--> statement-breakpoint
CREATE INDEX "shipments_shipped_at_index" ON "shipments" USING btree ("shipped_at");