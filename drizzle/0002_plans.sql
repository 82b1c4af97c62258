CREATE TABLE "plan_lots" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"plan_id" uuid NOT NULL,
	"lot_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"volume_l" double precision NOT NULL,
	"chosen_train_id" uuid
);
--> statement-breakpoint
CREATE TABLE "plan_trains" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"plan_lot_id" uuid NOT NULL,
	"name" text NOT NULL,
	"stages" jsonb NOT NULL,
	"hoses" jsonb
);
--> statement-breakpoint
CREATE TABLE "plans" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"winery_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"name" text NOT NULL,
	"planned_date" date NOT NULL,
	"line_id" uuid,
	"status" text DEFAULT 'draft' NOT NULL,
	"start_time" text DEFAULT '07:00' NOT NULL,
	"sanitation_kind" text DEFAULT 'hot-water' NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"approved_by" text,
	"approved_at" timestamp with time zone,
	"created_by" text
);
--> statement-breakpoint
ALTER TABLE "plan_lots" ADD CONSTRAINT "plan_lots_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_lots" ADD CONSTRAINT "plan_lots_plan_id_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."plans"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_lots" ADD CONSTRAINT "plan_lots_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_lots" ADD CONSTRAINT "plan_lots_chosen_train_id_plan_trains_id_fk" FOREIGN KEY ("chosen_train_id") REFERENCES "public"."plan_trains"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_trains" ADD CONSTRAINT "plan_trains_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_trains" ADD CONSTRAINT "plan_trains_plan_lot_id_plan_lots_id_fk" FOREIGN KEY ("plan_lot_id") REFERENCES "public"."plan_lots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_line_id_lines_id_fk" FOREIGN KEY ("line_id") REFERENCES "public"."lines"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_approved_by_users_id_fk" FOREIGN KEY ("approved_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "plan_lots_plan_lot_uq" ON "plan_lots" USING btree ("plan_id","lot_id");--> statement-breakpoint
CREATE INDEX "plan_lots_plan_idx" ON "plan_lots" USING btree ("plan_id","position");--> statement-breakpoint
CREATE INDEX "plan_trains_plan_lot_idx" ON "plan_trains" USING btree ("plan_lot_id","created_at");--> statement-breakpoint
CREATE INDEX "plans_winery_date_idx" ON "plans" USING btree ("winery_id","planned_date");--> statement-breakpoint
CREATE INDEX "plans_winery_status_idx" ON "plans" USING btree ("winery_id","status");