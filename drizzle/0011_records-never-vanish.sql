CREATE TABLE "run_changes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"run_id" uuid NOT NULL,
	"stage_index" integer NOT NULL,
	"kind" text NOT NULL,
	"at_volume_l" double precision NOT NULL,
	"removed_cartridge_ids" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"installed_cartridge_ids" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"created_by" text,
	"created_by_name" text
);
--> statement-breakpoint
CREATE TABLE "run_reading_corrections" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"run_id" uuid NOT NULL,
	"reading_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"volume_l" double precision,
	"upstream_bar" double precision,
	"downstream_bar" double precision,
	"flow_lh" double precision,
	"temp_c" double precision,
	"reason" text NOT NULL,
	"created_by" text,
	"created_by_name" text
);
--> statement-breakpoint
CREATE TABLE "run_stage_cartridges" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"run_id" uuid NOT NULL,
	"stage_index" integer NOT NULL,
	"housing_id" uuid NOT NULL,
	"housing_name" text NOT NULL,
	"cartridge_id" uuid NOT NULL,
	"serial" text NOT NULL,
	"batch" text,
	"type_id" uuid NOT NULL,
	"type_name" text NOT NULL,
	"rating_um" double precision NOT NULL,
	"length_in" double precision,
	"litres_at_start" double precision NOT NULL,
	"cycles_at_start" integer NOT NULL,
	"installed_at_volume_l" double precision DEFAULT 0 NOT NULL,
	"removed_at_volume_l" double precision,
	"litres_carried" double precision,
	"change_id" uuid
);
--> statement-breakpoint
ALTER TABLE "lab_results" DROP CONSTRAINT "lab_results_lot_id_lots_id_fk";
--> statement-breakpoint
ALTER TABLE "cartridge_events" DROP CONSTRAINT "cartridge_events_cartridge_id_cartridges_id_fk";
--> statement-breakpoint
ALTER TABLE "cartridge_events" DROP CONSTRAINT "cartridge_events_housing_id_housings_id_fk";
--> statement-breakpoint
ALTER TABLE "plan_lots" DROP CONSTRAINT "plan_lots_lot_id_lots_id_fk";
--> statement-breakpoint
ALTER TABLE "run_readings" DROP CONSTRAINT "run_readings_run_id_runs_id_fk";
--> statement-breakpoint
ALTER TABLE "runs" DROP CONSTRAINT "runs_plan_id_plans_id_fk";
--> statement-breakpoint
ALTER TABLE "runs" DROP CONSTRAINT "runs_plan_lot_id_plan_lots_id_fk";
--> statement-breakpoint
ALTER TABLE "lab_results" ADD COLUMN "created_by_name" text;--> statement-breakpoint
ALTER TABLE "lots" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "cartridge_types" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "housings" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "cartridge_events" ADD COLUMN "actor_name" text;--> statement-breakpoint
ALTER TABLE "cartridges" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "plans" ADD COLUMN "approved_by_name" text;--> statement-breakpoint
ALTER TABLE "plans" ADD COLUMN "created_by_name" text;--> statement-breakpoint
ALTER TABLE "plans" ADD COLUMN "revision" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "plans" ADD COLUMN "previous_plan_id" uuid;--> statement-breakpoint
ALTER TABLE "plans" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "run_readings" ADD COLUMN "created_by_name" text;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "started_by_name" text;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "closed_by_name" text;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "override_reason" text;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "override_by_name" text;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "overridden_checks" jsonb;--> statement-breakpoint
ALTER TABLE "run_changes" ADD CONSTRAINT "run_changes_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_changes" ADD CONSTRAINT "run_changes_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_changes" ADD CONSTRAINT "run_changes_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_reading_corrections" ADD CONSTRAINT "run_reading_corrections_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_reading_corrections" ADD CONSTRAINT "run_reading_corrections_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_reading_corrections" ADD CONSTRAINT "run_reading_corrections_reading_id_run_readings_id_fk" FOREIGN KEY ("reading_id") REFERENCES "public"."run_readings"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_reading_corrections" ADD CONSTRAINT "run_reading_corrections_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_stage_cartridges" ADD CONSTRAINT "run_stage_cartridges_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_stage_cartridges" ADD CONSTRAINT "run_stage_cartridges_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_stage_cartridges" ADD CONSTRAINT "run_stage_cartridges_housing_id_housings_id_fk" FOREIGN KEY ("housing_id") REFERENCES "public"."housings"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_stage_cartridges" ADD CONSTRAINT "run_stage_cartridges_cartridge_id_cartridges_id_fk" FOREIGN KEY ("cartridge_id") REFERENCES "public"."cartridges"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_stage_cartridges" ADD CONSTRAINT "run_stage_cartridges_type_id_cartridge_types_id_fk" FOREIGN KEY ("type_id") REFERENCES "public"."cartridge_types"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_stage_cartridges" ADD CONSTRAINT "run_stage_cartridges_change_id_run_changes_id_fk" FOREIGN KEY ("change_id") REFERENCES "public"."run_changes"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "run_changes_run_idx" ON "run_changes" USING btree ("run_id","at_volume_l");--> statement-breakpoint
CREATE INDEX "run_reading_corrections_reading_idx" ON "run_reading_corrections" USING btree ("reading_id","created_at");--> statement-breakpoint
CREATE INDEX "run_stage_cartridges_run_idx" ON "run_stage_cartridges" USING btree ("run_id","stage_index");--> statement-breakpoint
CREATE INDEX "run_stage_cartridges_cartridge_idx" ON "run_stage_cartridges" USING btree ("cartridge_id");--> statement-breakpoint
ALTER TABLE "lab_results" ADD CONSTRAINT "lab_results_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cartridge_events" ADD CONSTRAINT "cartridge_events_cartridge_id_cartridges_id_fk" FOREIGN KEY ("cartridge_id") REFERENCES "public"."cartridges"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cartridge_events" ADD CONSTRAINT "cartridge_events_housing_id_housings_id_fk" FOREIGN KEY ("housing_id") REFERENCES "public"."housings"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_lots" ADD CONSTRAINT "plan_lots_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_previous_plan_id_plans_id_fk" FOREIGN KEY ("previous_plan_id") REFERENCES "public"."plans"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_readings" ADD CONSTRAINT "run_readings_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_plan_id_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."plans"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_plan_lot_id_plan_lots_id_fk" FOREIGN KEY ("plan_lot_id") REFERENCES "public"."plan_lots"("id") ON DELETE restrict ON UPDATE no action;