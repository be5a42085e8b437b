CREATE TABLE "datalog_mappings" (
	"shop_id" text NOT NULL,
	"header_key" text NOT NULL,
	"mapping" jsonb NOT NULL,
	"updated_by" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "datalog_mappings_shop_id_header_key_pk" PRIMARY KEY("shop_id","header_key")
);
--> statement-breakpoint
ALTER TABLE "datalogs" ADD COLUMN "mapping" jsonb;--> statement-breakpoint
ALTER TABLE "datalogs" ADD COLUMN "analysis" jsonb;--> statement-breakpoint
ALTER TABLE "datalogs" ADD COLUMN "verified_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "datalogs" ADD COLUMN "verified_by" text;--> statement-breakpoint
ALTER TABLE "datalog_mappings" ADD CONSTRAINT "datalog_mappings_shop_id_organization_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "datalog_mappings" ADD CONSTRAINT "datalog_mappings_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "datalogs" ADD CONSTRAINT "datalogs_verified_by_user_id_fk" FOREIGN KEY ("verified_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;