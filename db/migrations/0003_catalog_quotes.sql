CREATE TABLE "parts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"sku" text NOT NULL,
	"category" text NOT NULL,
	"brand" text NOT NULL,
	"name" text NOT NULL,
	"price_minor" integer NOT NULL,
	"cost_minor" integer DEFAULT 0 NOT NULL,
	"stock" integer DEFAULT 0 NOT NULL,
	"reserved" integer DEFAULT 0 NOT NULL,
	"reorder_level" integer DEFAULT 0 NOT NULL,
	"specs" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "parts_money_nonneg" CHECK ("parts"."price_minor" >= 0 and "parts"."cost_minor" >= 0 and "parts"."reserved" >= 0)
);
--> statement-breakpoint
CREATE TABLE "quote_lines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"quote_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"kind" text NOT NULL,
	"part_id" uuid,
	"sku" text,
	"description" text NOT NULL,
	"quantity_milli" integer NOT NULL,
	"unit_price_minor" integer NOT NULL,
	"discount_bp" integer DEFAULT 0 NOT NULL
);
--> statement-breakpoint
CREATE TABLE "quote_messages" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"quote_id" uuid NOT NULL,
	"to" text NOT NULL,
	"subject" text NOT NULL,
	"message_id" text,
	"sent_by" text,
	"sent_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "quotes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"number" integer NOT NULL,
	"revision" integer DEFAULT 1 NOT NULL,
	"customer_id" uuid NOT NULL,
	"build_id" uuid,
	"status" text DEFAULT 'draft' NOT NULL,
	"currency" text NOT NULL,
	"tax_rate_bp" integer NOT NULL,
	"valid_until" date NOT NULL,
	"notes" text,
	"subtotal_minor" integer DEFAULT 0 NOT NULL,
	"discount_minor" integer DEFAULT 0 NOT NULL,
	"tax_minor" integer DEFAULT 0 NOT NULL,
	"total_minor" integer DEFAULT 0 NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"status_changed_at" timestamp with time zone,
	"status_changed_by" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "shop_counters" (
	"shop_id" text NOT NULL,
	"name" text NOT NULL,
	"value" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "shop_counters_shop_id_name_pk" PRIMARY KEY("shop_id","name")
);
--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "labour_rate_minor" integer DEFAULT 12000 NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "deposit_bp" integer DEFAULT 3000 NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "quote_valid_days" integer DEFAULT 30 NOT NULL;--> statement-breakpoint
ALTER TABLE "build_revisions" ADD COLUMN "parts" jsonb DEFAULT '[]'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "builds" ADD COLUMN "parts" jsonb DEFAULT '[]'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "parts" ADD CONSTRAINT "parts_shop_id_organization_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_lines" ADD CONSTRAINT "quote_lines_shop_id_organization_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_lines" ADD CONSTRAINT "quote_lines_quote_id_quotes_id_fk" FOREIGN KEY ("quote_id") REFERENCES "public"."quotes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_lines" ADD CONSTRAINT "quote_lines_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_messages" ADD CONSTRAINT "quote_messages_shop_id_organization_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_messages" ADD CONSTRAINT "quote_messages_quote_id_quotes_id_fk" FOREIGN KEY ("quote_id") REFERENCES "public"."quotes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_messages" ADD CONSTRAINT "quote_messages_sent_by_user_id_fk" FOREIGN KEY ("sent_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_shop_id_organization_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_build_id_builds_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."builds"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_status_changed_by_user_id_fk" FOREIGN KEY ("status_changed_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shop_counters" ADD CONSTRAINT "shop_counters_shop_id_organization_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "parts_shop_sku_idx" ON "parts" USING btree ("shop_id","sku");--> statement-breakpoint
CREATE INDEX "parts_shop_category_idx" ON "parts" USING btree ("shop_id","category","name");--> statement-breakpoint
CREATE INDEX "quote_lines_quote_idx" ON "quote_lines" USING btree ("quote_id","position");--> statement-breakpoint
CREATE INDEX "quote_lines_shop_idx" ON "quote_lines" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "quote_messages_quote_idx" ON "quote_messages" USING btree ("quote_id");--> statement-breakpoint
CREATE UNIQUE INDEX "quotes_shop_number_rev_idx" ON "quotes" USING btree ("shop_id","number","revision");--> statement-breakpoint
CREATE INDEX "quotes_shop_updated_idx" ON "quotes" USING btree ("shop_id","updated_at");--> statement-breakpoint
CREATE INDEX "quotes_shop_customer_idx" ON "quotes" USING btree ("shop_id","customer_id");--> statement-breakpoint
CREATE INDEX "quotes_build_idx" ON "quotes" USING btree ("build_id");