CREATE TABLE "audit_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"winery_id" uuid NOT NULL,
	"user_id" text,
	"user_name" text DEFAULT '' NOT NULL,
	"action" text NOT NULL,
	"record_kind" text NOT NULL,
	"record_id" text NOT NULL,
	"record_label" text DEFAULT '' NOT NULL,
	"parent_kind" text,
	"parent_id" text,
	"changes" jsonb
);
--> statement-breakpoint
ALTER TABLE "audit_events" ADD CONSTRAINT "audit_events_winery_id_wineries_id_fk" FOREIGN KEY ("winery_id") REFERENCES "public"."wineries"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "audit_events_winery_at_idx" ON "audit_events" USING btree ("winery_id","at");--> statement-breakpoint
CREATE INDEX "audit_events_record_idx" ON "audit_events" USING btree ("winery_id","record_kind","record_id");--> statement-breakpoint
CREATE INDEX "audit_events_parent_idx" ON "audit_events" USING btree ("winery_id","parent_kind","parent_id");--> statement-breakpoint
CREATE INDEX "audit_events_user_idx" ON "audit_events" USING btree ("winery_id","user_id");