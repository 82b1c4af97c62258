CREATE TABLE "hose_presets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"name" text NOT NULL,
	"diameter_mm" double precision NOT NULL,
	"length_m" double precision NOT NULL,
	"roughness_mm" double precision,
	"sum_k" double precision,
	"created_by" text,
	"created_by_name" text
);
--> statement-breakpoint
ALTER TABLE "hose_presets" ADD CONSTRAINT "hose_presets_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "hose_presets" ADD CONSTRAINT "hose_presets_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "hose_presets_winery_name_uq" ON "hose_presets" USING btree ("winery_id","name");