CREATE TABLE "lab_results" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"lot_id" uuid NOT NULL,
	"sampled_at" timestamp with time zone NOT NULL,
	"turbidity_ntu" double precision,
	"t200_s" double precision,
	"t400_s" double precision,
	"disc_diameter_mm" double precision,
	"disc_pressure_bar" double precision,
	"disc_points" jsonb,
	"free_so2_mg_l" double precision,
	"notes" text DEFAULT '' NOT NULL,
	"created_by" text
);
--> statement-breakpoint
CREATE TABLE "lots" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"style" text NOT NULL,
	"vintage" integer,
	"volume_l" double precision NOT NULL,
	"tank_id" uuid,
	"ethanol_pct_vol" double precision NOT NULL,
	"sugar_g_per_l" double precision DEFAULT 0 NOT NULL,
	"temp_c" double precision NOT NULL,
	"notes" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "tanks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"name" text NOT NULL,
	"capacity_l" double precision NOT NULL,
	"notes" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "cartridge_types" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"name" text NOT NULL,
	"kind" text NOT NULL,
	"media" text NOT NULL,
	"rating_um" double precision NOT NULL,
	"area_m2_per_10in" double precision NOT NULL,
	"water_flow_lh_per_10in" double precision NOT NULL,
	"water_dp_bar" double precision NOT NULL,
	"max_dp_forward_bar" double precision NOT NULL,
	"max_dp_reverse_bar" double precision,
	"max_temp_c" double precision NOT NULL,
	"terminal_dp_bar" double precision NOT NULL,
	"design_flux_lh_per_10in" double precision NOT NULL,
	"rated_steam_cycles" integer,
	"rated_hot_water_cycles" integer,
	"rated_chemical_cycles" integer,
	"flow_recovery_min_pct" double precision DEFAULT 70 NOT NULL,
	"bubble_point_min_bar" double precision,
	"diffusion_max_ml_min_per_10in" double precision,
	"price_per_10in" double precision,
	"currency" text DEFAULT 'EUR' NOT NULL,
	"certificate_attachment_id" uuid,
	"notes" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "housings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"name" text NOT NULL,
	"rounds" integer NOT NULL,
	"length_in" integer NOT NULL,
	"max_pressure_bar" double precision NOT NULL,
	"max_temp_c" double precision NOT NULL,
	"hold_up_l" double precision NOT NULL,
	"upstream_gas_volume_l" double precision,
	"notes" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "lines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"name" text NOT NULL,
	"bottles_per_hour" double precision NOT NULL,
	"bottle_ml" double precision NOT NULL,
	"notes" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "cartridge_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"cartridge_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"housing_id" uuid,
	"position" integer,
	"details" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"actor_id" text,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "cartridges" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"serial" text NOT NULL,
	"batch" text DEFAULT '' NOT NULL,
	"type_id" uuid NOT NULL,
	"length_in" integer NOT NULL,
	"status" text DEFAULT 'in-stock' NOT NULL,
	"housing_id" uuid,
	"position" integer,
	"received_at" date,
	"litres_filtered" double precision DEFAULT 0 NOT NULL,
	"steam_cycles" integer DEFAULT 0 NOT NULL,
	"hot_water_cycles" integer DEFAULT 0 NOT NULL,
	"chemical_cycles" integer DEFAULT 0 NOT NULL,
	"retired_reason" text,
	"notes" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "attachments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"owner_kind" text NOT NULL,
	"owner_id" uuid NOT NULL,
	"file_name" text NOT NULL,
	"content_type" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"storage_key" text NOT NULL,
	"uploaded_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "idempotency_keys" (
	"user_id" text NOT NULL,
	"key" text NOT NULL,
	"route" text NOT NULL,
	"status" integer NOT NULL,
	"body" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "idempotency_keys_user_id_key_pk" PRIMARY KEY("user_id","key")
);
--> statement-breakpoint
ALTER TABLE "lab_results" ADD CONSTRAINT "lab_results_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_results" ADD CONSTRAINT "lab_results_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_results" ADD CONSTRAINT "lab_results_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tanks" ADD CONSTRAINT "tanks_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cartridge_types" ADD CONSTRAINT "cartridge_types_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "housings" ADD CONSTRAINT "housings_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lines" ADD CONSTRAINT "lines_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cartridge_events" ADD CONSTRAINT "cartridge_events_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cartridge_events" ADD CONSTRAINT "cartridge_events_cartridge_id_cartridges_id_fk" FOREIGN KEY ("cartridge_id") REFERENCES "public"."cartridges"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cartridge_events" ADD CONSTRAINT "cartridge_events_housing_id_housings_id_fk" FOREIGN KEY ("housing_id") REFERENCES "public"."housings"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cartridge_events" ADD CONSTRAINT "cartridge_events_actor_id_users_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cartridges" ADD CONSTRAINT "cartridges_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cartridges" ADD CONSTRAINT "cartridges_type_id_cartridge_types_id_fk" FOREIGN KEY ("type_id") REFERENCES "public"."cartridge_types"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cartridges" ADD CONSTRAINT "cartridges_housing_id_housings_id_fk" FOREIGN KEY ("housing_id") REFERENCES "public"."housings"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "idempotency_keys" ADD CONSTRAINT "idempotency_keys_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "lab_results_lot_idx" ON "lab_results" USING btree ("lot_id","sampled_at");--> statement-breakpoint
CREATE UNIQUE INDEX "lots_winery_code_uq" ON "lots" USING btree ("winery_id","code");--> statement-breakpoint
CREATE INDEX "lots_winery_tank_idx" ON "lots" USING btree ("winery_id","tank_id");--> statement-breakpoint
CREATE UNIQUE INDEX "tanks_winery_name_uq" ON "tanks" USING btree ("winery_id","name");--> statement-breakpoint
CREATE UNIQUE INDEX "cartridge_types_winery_name_uq" ON "cartridge_types" USING btree ("winery_id","name");--> statement-breakpoint
CREATE INDEX "cartridge_types_winery_kind_idx" ON "cartridge_types" USING btree ("winery_id","kind");--> statement-breakpoint
CREATE UNIQUE INDEX "housings_winery_name_uq" ON "housings" USING btree ("winery_id","name");--> statement-breakpoint
CREATE UNIQUE INDEX "lines_winery_name_uq" ON "lines" USING btree ("winery_id","name");--> statement-breakpoint
CREATE INDEX "cartridge_events_cartridge_idx" ON "cartridge_events" USING btree ("cartridge_id","at");--> statement-breakpoint
CREATE UNIQUE INDEX "cartridges_winery_serial_uq" ON "cartridges" USING btree ("winery_id","serial");--> statement-breakpoint
CREATE INDEX "cartridges_winery_status_idx" ON "cartridges" USING btree ("winery_id","status");--> statement-breakpoint
CREATE INDEX "cartridges_winery_type_idx" ON "cartridges" USING btree ("winery_id","type_id");--> statement-breakpoint
CREATE INDEX "cartridges_winery_housing_idx" ON "cartridges" USING btree ("winery_id","housing_id");--> statement-breakpoint
CREATE INDEX "cartridges_winery_batch_idx" ON "cartridges" USING btree ("winery_id","batch");--> statement-breakpoint
CREATE INDEX "attachments_owner_idx" ON "attachments" USING btree ("winery_id","owner_kind","owner_id");