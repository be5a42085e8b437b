CREATE TABLE "build_revisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"build_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"status" text NOT NULL,
	"inputs" jsonb NOT NULL,
	"result" jsonb,
	"calc_version" text,
	"note" text,
	"author_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "builds" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"customer_id" uuid NOT NULL,
	"title" text NOT NULL,
	"vehicle" text,
	"status" text DEFAULT 'draft' NOT NULL,
	"inputs" jsonb NOT NULL,
	"inputs_schema_version" integer DEFAULT 1 NOT NULL,
	"result" jsonb,
	"calc_version" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_by" text,
	"updated_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "build_revisions" ADD CONSTRAINT "build_revisions_shop_id_organization_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_revisions" ADD CONSTRAINT "build_revisions_build_id_builds_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."builds"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_revisions" ADD CONSTRAINT "build_revisions_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "builds" ADD CONSTRAINT "builds_shop_id_organization_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "builds" ADD CONSTRAINT "builds_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "builds" ADD CONSTRAINT "builds_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "builds" ADD CONSTRAINT "builds_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "build_revisions_build_version_idx" ON "build_revisions" USING btree ("build_id","version");--> statement-breakpoint
CREATE INDEX "build_revisions_shop_idx" ON "build_revisions" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "builds_shop_updated_idx" ON "builds" USING btree ("shop_id","updated_at","id");--> statement-breakpoint
CREATE INDEX "builds_shop_status_idx" ON "builds" USING btree ("shop_id","status");--> statement-breakpoint
CREATE INDEX "builds_shop_customer_idx" ON "builds" USING btree ("shop_id","customer_id");