CREATE TABLE "tune_pulls" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"build_id" uuid NOT NULL,
	"datalog_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"ethanol_pct" real NOT NULL,
	"boost_target_kpa" real,
	"notes" text DEFAULT '' NOT NULL,
	"power_measured_at" text NOT NULL,
	"drivetrain_loss_pct" real NOT NULL,
	"excluded" boolean DEFAULT false NOT NULL,
	"mapping" jsonb NOT NULL,
	"points" jsonb NOT NULL,
	"summary" jsonb NOT NULL,
	"log_notes" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "tune_sessions" (
	"shop_id" text NOT NULL,
	"build_id" uuid NOT NULL,
	"limits" jsonb,
	"updated_by" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "tune_sessions_shop_id_build_id_pk" PRIMARY KEY("shop_id","build_id")
);
--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "tune_limits" jsonb;--> statement-breakpoint
ALTER TABLE "builds" ADD COLUMN "previous_step_id" uuid;--> statement-breakpoint
ALTER TABLE "tune_pulls" ADD CONSTRAINT "tune_pulls_shop_id_organization_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tune_pulls" ADD CONSTRAINT "tune_pulls_build_id_builds_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."builds"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tune_pulls" ADD CONSTRAINT "tune_pulls_datalog_id_datalogs_id_fk" FOREIGN KEY ("datalog_id") REFERENCES "public"."datalogs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tune_pulls" ADD CONSTRAINT "tune_pulls_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tune_sessions" ADD CONSTRAINT "tune_sessions_shop_id_organization_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tune_sessions" ADD CONSTRAINT "tune_sessions_build_id_builds_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."builds"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tune_sessions" ADD CONSTRAINT "tune_sessions_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "tune_pulls_build_idx" ON "tune_pulls" USING btree ("shop_id","build_id","position");--> statement-breakpoint
CREATE UNIQUE INDEX "tune_pulls_datalog_idx" ON "tune_pulls" USING btree ("datalog_id");--> statement-breakpoint
ALTER TABLE "builds" ADD CONSTRAINT "builds_previous_step_id_builds_id_fk" FOREIGN KEY ("previous_step_id") REFERENCES "public"."builds"("id") ON DELETE set null ON UPDATE no action;