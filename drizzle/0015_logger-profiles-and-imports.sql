CREATE TABLE "logger_imports" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"run_id" uuid NOT NULL,
	"stage_index" integer NOT NULL,
	"file_sha256" text NOT NULL,
	"file_name" text NOT NULL,
	"row_count" integer NOT NULL,
	"imported_count" integer NOT NULL,
	"attachment_id" uuid,
	"profile_id" uuid,
	"mapping" jsonb NOT NULL,
	"created_by" text,
	"created_by_name" text
);
--> statement-breakpoint
CREATE TABLE "logger_profiles" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"name" text NOT NULL,
	"mapping" jsonb NOT NULL,
	"created_by" text,
	"created_by_name" text
);
--> statement-breakpoint
ALTER TABLE "logger_imports" ADD CONSTRAINT "logger_imports_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "logger_imports" ADD CONSTRAINT "logger_imports_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "logger_imports" ADD CONSTRAINT "logger_imports_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "logger_profiles" ADD CONSTRAINT "logger_profiles_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "logger_profiles" ADD CONSTRAINT "logger_profiles_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "logger_imports_run_stage_file_uq" ON "logger_imports" USING btree ("run_id","stage_index","file_sha256");--> statement-breakpoint
CREATE INDEX "logger_imports_winery_idx" ON "logger_imports" USING btree ("winery_id");--> statement-breakpoint
CREATE UNIQUE INDEX "logger_profiles_winery_name_uq" ON "logger_profiles" USING btree ("winery_id","name");