CREATE TABLE "rate_limit_hits" (
	"key" text PRIMARY KEY NOT NULL,
	"hits" integer DEFAULT 0 NOT NULL,
	"reset_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "reading_count" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "current_volume_l" double precision DEFAULT 0 NOT NULL;--> statement-breakpoint
CREATE INDEX "rate_limit_hits_reset_idx" ON "rate_limit_hits" USING btree ("reset_at");