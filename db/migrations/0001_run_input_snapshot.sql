ALTER TABLE "runs" ADD COLUMN "patient" jsonb;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "rig_body" jsonb;