-- Records keep the person's name as it was: fill the new *_by_name columns from the users
-- the records point at today, so removing a member later never blanks "who".
UPDATE "runs" SET "started_by_name" = u."name" FROM "users" u WHERE u."id" = "runs"."started_by" AND "runs"."started_by_name" IS NULL;
--> statement-breakpoint
UPDATE "runs" SET "closed_by_name" = u."name" FROM "users" u WHERE u."id" = "runs"."closed_by" AND "runs"."closed_by_name" IS NULL;
--> statement-breakpoint
UPDATE "run_readings" SET "created_by_name" = u."name" FROM "users" u WHERE u."id" = "run_readings"."created_by" AND "run_readings"."created_by_name" IS NULL;
--> statement-breakpoint
UPDATE "cartridge_events" SET "actor_name" = u."name" FROM "users" u WHERE u."id" = "cartridge_events"."actor_id" AND "cartridge_events"."actor_name" IS NULL;
--> statement-breakpoint
UPDATE "plans" SET "approved_by_name" = u."name" FROM "users" u WHERE u."id" = "plans"."approved_by" AND "plans"."approved_by_name" IS NULL;
--> statement-breakpoint
UPDATE "plans" SET "created_by_name" = u."name" FROM "users" u WHERE u."id" = "plans"."created_by" AND "plans"."created_by_name" IS NULL;
--> statement-breakpoint
UPDATE "lab_results" SET "created_by_name" = u."name" FROM "users" u WHERE u."id" = "lab_results"."created_by" AND "lab_results"."created_by_name" IS NULL;
