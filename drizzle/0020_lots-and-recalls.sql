CREATE TABLE "lot_recall_notices" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lot_id" uuid NOT NULL,
	"customer_email" text NOT NULL,
	"mail_id" uuid,
	"order_ids" uuid[] NOT NULL,
	"queued_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "lot_recall_notices_lotId_customerEmail_unique" UNIQUE("lot_id","customer_email")
);
--> statement-breakpoint
CREATE TABLE "stock_lots" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"part_id" uuid NOT NULL,
	"code" text NOT NULL,
	"first_received_at" timestamp with time zone DEFAULT now() NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "stock_lots_code_not_blank" CHECK (length(trim("stock_lots"."code")) > 0)
);
--> statement-breakpoint
CREATE TABLE "unit_lots" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"work_order_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"lot_id" uuid NOT NULL,
	"quantity" integer NOT NULL,
	"fitted_by" uuid NOT NULL,
	"fitted_at" timestamp with time zone DEFAULT now() NOT NULL,
	"undone_at" timestamp with time zone,
	"undone_by" uuid,
	CONSTRAINT "unit_lots_quantity_positive" CHECK ("unit_lots"."quantity" > 0),
	CONSTRAINT "unit_lots_undo_has_who" CHECK (("unit_lots"."undone_at" is null) = ("unit_lots"."undone_by" is null))
);
--> statement-breakpoint
ALTER TABLE "parts" ADD COLUMN "lot_tracked" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "stock_moves" ADD COLUMN "lot_id" uuid;--> statement-breakpoint
ALTER TABLE "lot_recall_notices" ADD CONSTRAINT "lot_recall_notices_lot_id_stock_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."stock_lots"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lot_recall_notices" ADD CONSTRAINT "lot_recall_notices_mail_id_mail_messages_id_fk" FOREIGN KEY ("mail_id") REFERENCES "public"."mail_messages"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lot_recall_notices" ADD CONSTRAINT "lot_recall_notices_queued_by_users_id_fk" FOREIGN KEY ("queued_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_lots" ADD CONSTRAINT "stock_lots_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_lots" ADD CONSTRAINT "unit_lots_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_lots" ADD CONSTRAINT "unit_lots_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_lots" ADD CONSTRAINT "unit_lots_lot_id_stock_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."stock_lots"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_lots" ADD CONSTRAINT "unit_lots_fitted_by_users_id_fk" FOREIGN KEY ("fitted_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_lots" ADD CONSTRAINT "unit_lots_undone_by_users_id_fk" FOREIGN KEY ("undone_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "stock_lots_part_code" ON "stock_lots" USING btree ("part_id",upper("code"));--> statement-breakpoint
CREATE INDEX "stock_lots_code_upper" ON "stock_lots" USING btree (upper("code"));--> statement-breakpoint
CREATE INDEX "unit_lots_work_order_id_index" ON "unit_lots" USING btree ("work_order_id");--> statement-breakpoint
CREATE INDEX "unit_lots_lot_id_index" ON "unit_lots" USING btree ("lot_id");--> statement-breakpoint
ALTER TABLE "stock_moves" ADD CONSTRAINT "stock_moves_lot_id_stock_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."stock_lots"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "stock_moves_lot_id_index" ON "stock_moves" USING btree ("lot_id");