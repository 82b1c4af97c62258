CREATE TABLE "cartridge_life_flags" (
	"cartridge_id" uuid PRIMARY KEY NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"checked_version" integer,
	"rank" integer,
	"closeness" double precision,
	"attention" jsonb
);
--> statement-breakpoint
ALTER TABLE "cartridge_life_flags" ADD CONSTRAINT "cartridge_life_flags_cartridge_id_cartridges_id_fk" FOREIGN KEY ("cartridge_id") REFERENCES "public"."cartridges"("id") ON DELETE cascade ON UPDATE no action;