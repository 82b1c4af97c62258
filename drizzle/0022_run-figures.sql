CREATE TABLE "run_figures" (
	"run_id" uuid PRIMARY KEY NOT NULL,
	"version" integer DEFAULT 0 NOT NULL,
	"page_version" integer,
	"page_key" text,
	"page" json,
	"today_version" integer,
	"today_key" text,
	"today" json
);
--> statement-breakpoint
ALTER TABLE "run_figures" ADD CONSTRAINT "run_figures_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "run_readings_unnamed_by_idx" ON "run_readings" USING btree ("created_by") WHERE "run_readings"."created_by_name" is null;