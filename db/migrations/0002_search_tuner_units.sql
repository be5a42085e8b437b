CREATE EXTENSION IF NOT EXISTS pg_trgm;--> statement-breakpoint
DROP INDEX "builds_shop_status_idx";--> statement-breakpoint
ALTER TABLE "user" ADD COLUMN "unit_system" text;--> statement-breakpoint
ALTER TABLE "builds" ADD COLUMN "search_text" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "builds" ADD COLUMN "tuner_id" text;--> statement-breakpoint
ALTER TABLE "builds" ADD CONSTRAINT "builds_tuner_id_user_id_fk" FOREIGN KEY ("tuner_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "builds_shop_status_updated_idx" ON "builds" USING btree ("shop_id","status","updated_at","id");--> statement-breakpoint
CREATE INDEX "builds_shop_created_idx" ON "builds" USING btree ("shop_id","created_at","id");--> statement-breakpoint
CREATE INDEX "builds_shop_title_idx" ON "builds" USING btree ("shop_id","title","id");--> statement-breakpoint
CREATE INDEX "builds_shop_tuner_idx" ON "builds" USING btree ("shop_id","tuner_id","updated_at","id");--> statement-breakpoint
CREATE INDEX "builds_search_trgm_idx" ON "builds" USING gin ("search_text" gin_trgm_ops);--> statement-breakpoint
UPDATE "builds" b SET "search_text" = lower(b."title" || ' ' || coalesce(b."vehicle", '') || ' ' || c."name"), "tuner_id" = b."created_by" FROM "customers" c WHERE c."id" = b."customer_id";
--> statement-breakpoint
CREATE FUNCTION builds_search_text() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  NEW.search_text := lower(NEW.title || ' ' || coalesce(NEW.vehicle, '') || ' ' || coalesce((SELECT name FROM customers WHERE id = NEW.customer_id), ''));
  RETURN NEW;
END $$;--> statement-breakpoint
CREATE TRIGGER builds_search_text_trg BEFORE INSERT OR UPDATE OF title, vehicle, customer_id ON builds FOR EACH ROW EXECUTE FUNCTION builds_search_text();--> statement-breakpoint
CREATE FUNCTION customers_rename_builds() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  UPDATE builds SET search_text = lower(title || ' ' || coalesce(vehicle, '') || ' ' || NEW.name) WHERE customer_id = NEW.id;
  RETURN NEW;
END $$;--> statement-breakpoint
CREATE TRIGGER customers_rename_builds_trg AFTER UPDATE OF name ON customers FOR EACH ROW WHEN (OLD.name IS DISTINCT FROM NEW.name) EXECUTE FUNCTION customers_rename_builds();
