ALTER TABLE "builds" ADD COLUMN "kit_basis" jsonb;--> statement-breakpoint
ALTER TABLE "parts" ADD COLUMN "lead_time_days" integer;--> statement-breakpoint
ALTER TABLE "parts" ADD COLUMN "restock_on" date;--> statement-breakpoint
ALTER TABLE "quote_lines" ADD COLUMN "held_qty" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
-- Quotes that hold stock today held every unit of their part lines (ceil of the thousandths):
-- record that per line, so releasing them gives back exactly what they took.
UPDATE "quote_lines" AS l SET "held_qty" = ceil(l."quantity_milli" / 1000.0)::integer
FROM "quotes" AS q
WHERE q."id" = l."quote_id" AND l."kind" = 'part' AND l."part_id" IS NOT NULL
  AND q."status" IN ('accepted', 'deposit_paid', 'ordered');
