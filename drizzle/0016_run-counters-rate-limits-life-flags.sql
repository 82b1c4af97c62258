CREATE TABLE "rate_limit_hits" (
	"key" text PRIMARY KEY NOT NULL,
	"hits" integer DEFAULT 0 NOT NULL,
	"reset_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE TABLE "cartridge_life_flags" (
	"cartridge_id" uuid PRIMARY KEY NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"checked_version" integer,
	"rank" integer,
	"closeness" double precision,
	"attention" jsonb
);
--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "reading_count" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "current_volume_l" double precision DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "cartridge_life_flags" ADD CONSTRAINT "cartridge_life_flags_cartridge_id_cartridges_id_fk" FOREIGN KEY ("cartridge_id") REFERENCES "public"."cartridges"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "rate_limit_hits_reset_idx" ON "rate_limit_hits" USING btree ("reset_at");