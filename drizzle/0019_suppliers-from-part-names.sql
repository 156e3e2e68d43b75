-- Suppliers from the free-text supplier names parts carried: one supplier per name (whatever its case),
-- with the longest lead time of its parts; each part linked to its supplier, at its current cost.
INSERT INTO "suppliers" ("name", "lead_time_days")
SELECT min(trim("supplier")), max("lead_time_days") FROM "parts"
WHERE coalesce(trim("supplier"), '') <> '' GROUP BY lower(trim("supplier"));
--> statement-breakpoint
UPDATE "parts" p SET "supplier_id" = s."id" FROM "suppliers" s WHERE lower(trim(p."supplier")) = lower(s."name");
--> statement-breakpoint
INSERT INTO "supplier_parts" ("supplier_id", "part_id", "price_breaks")
SELECT "supplier_id", "id", jsonb_build_array(jsonb_build_object('minQuantity', 1, 'unitPriceCents', "unit_cost_cents"))
FROM "parts" WHERE "supplier_id" IS NOT NULL;
