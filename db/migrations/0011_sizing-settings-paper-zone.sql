ALTER TABLE "shop_settings" ADD COLUMN "gasoline_density_kg_per_l" real;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "gasoline_stoich_afr" real;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "ethanol_density_kg_per_l" real;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "ethanol_stoich_afr" real;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "paper_size" text DEFAULT 'letter' NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "time_zone" text DEFAULT 'UTC' NOT NULL;--> statement-breakpoint
ALTER TABLE "build_revisions" ADD COLUMN "sizing_settings" jsonb;--> statement-breakpoint
ALTER TABLE "builds" ADD COLUMN "sizing_settings" jsonb;--> statement-breakpoint
-- Shops that existed printed on A4; those paying in US, Canadian or Mexican currency print on Letter from now on.
UPDATE "shop_settings" SET "paper_size" = 'a4' WHERE "currency" NOT IN ('USD', 'CAD', 'MXN');
