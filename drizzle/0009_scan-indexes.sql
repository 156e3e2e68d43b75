CREATE INDEX "parts_sku_upper_index" ON "parts" USING btree (upper("sku"));--> statement-breakpoint
CREATE INDEX "orders_number_upper_index" ON "orders" USING btree (upper("number"));--> statement-breakpoint
CREATE INDEX "work_orders_serial_upper_index" ON "work_orders" USING btree (upper("serial"));--> statement-breakpoint
CREATE INDEX "bins_code_upper_index" ON "bins" USING btree (upper("code"));