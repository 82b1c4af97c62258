ALTER TABLE "plans" ADD COLUMN "approval_cautions" jsonb;--> statement-breakpoint
ALTER TABLE "plans" ADD COLUMN "approval_reason" text;