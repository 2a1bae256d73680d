ALTER TABLE "photos" ADD COLUMN "removed_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "removed_by" uuid;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "removal_reason" text;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_removed_by_fk" FOREIGN KEY ("workspace_id","removed_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_removal_complete" CHECK (("photos"."removed_at" IS NULL) = ("photos"."removed_by" IS NULL) AND ("photos"."removed_at" IS NULL) = ("photos"."removal_reason" IS NULL));