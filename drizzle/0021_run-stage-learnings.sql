CREATE TABLE "run_stage_learnings" (
	"run_id" uuid NOT NULL,
	"stage_index" integer NOT NULL,
	"inputs" text NOT NULL,
	"litres" double precision,
	"basis" text,
	"sets" integer,
	"computed_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "run_stage_learnings_run_id_stage_index_pk" PRIMARY KEY("run_id","stage_index")
);
--> statement-breakpoint
ALTER TABLE "run_stage_learnings" ADD CONSTRAINT "run_stage_learnings_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "run_reading_corrections_run_idx" ON "run_reading_corrections" USING btree ("run_id");