DROP INDEX "regions_workspace_photo_idx";--> statement-breakpoint
ALTER TABLE "regions" ADD COLUMN "position" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
CREATE INDEX "regions_workspace_photo_idx" ON "regions" USING btree ("workspace_id","photo_id","position");