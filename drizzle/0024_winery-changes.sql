CREATE TABLE "winery_change_counts" (
	"winery_id" uuid PRIMARY KEY NOT NULL,
	"n" bigint DEFAULT 0 NOT NULL
);
--> statement-breakpoint
CREATE TABLE "winery_changes" (
	"winery_id" uuid NOT NULL,
	"txid" bigint NOT NULL,
	CONSTRAINT "winery_changes_winery_id_txid_pk" PRIMARY KEY("winery_id","txid")
);
