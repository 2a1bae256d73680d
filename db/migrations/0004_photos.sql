CREATE TABLE "photos" (
	"id" uuid PRIMARY KEY NOT NULL,
	"workspace_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"view_key" text NOT NULL,
	"status" text DEFAULT 'queued' NOT NULL,
	"failure_code" text,
	"failure_reason" text,
	"original_key" text,
	"preview_key" text,
	"thumbnail_key" text,
	"content_type" text NOT NULL,
	"file_name" text NOT NULL,
	"bytes" integer NOT NULL,
	"sha256" text NOT NULL,
	"format" text,
	"width" integer,
	"height" integer,
	"orientation" integer,
	"preview_width" integer,
	"preview_height" integer,
	"thumbnail_width" integer,
	"thumbnail_height" integer,
	"capture_time" timestamp with time zone,
	"capture_time_offset" text,
	"possible_reuse_of_photo_id" uuid,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"uploaded_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"processed_at" timestamp with time zone,
	CONSTRAINT "photos_ready_has_derivatives" CHECK ("photos"."status" <> 'ready' OR ("photos"."original_key" IS NOT NULL AND "photos"."preview_key" IS NOT NULL AND "photos"."thumbnail_key" IS NOT NULL AND "photos"."width" IS NOT NULL AND "photos"."height" IS NOT NULL AND "photos"."format" IS NOT NULL)),
	CONSTRAINT "photos_original_present" CHECK ("photos"."original_key" IS NOT NULL OR ("photos"."status" = 'failed' AND "photos"."failure_code" <> 'processing_failed')),
	CONSTRAINT "photos_failed_has_reason" CHECK (("photos"."status" = 'failed') = ("photos"."failure_code" IS NOT NULL AND "photos"."failure_reason" IS NOT NULL)),
	CONSTRAINT "photos_bytes_positive" CHECK ("photos"."bytes" > 0)
);
--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_possible_reuse_of_photo_id_photos_id_fk" FOREIGN KEY ("possible_reuse_of_photo_id") REFERENCES "public"."photos"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "photos_unit_sha256_key" ON "photos" USING btree ("unit_id","sha256");--> statement-breakpoint
CREATE INDEX "photos_unit_idx" ON "photos" USING btree ("unit_id","created_at");--> statement-breakpoint
CREATE INDEX "photos_workspace_sha256_idx" ON "photos" USING btree ("workspace_id","sha256");--> statement-breakpoint
CREATE INDEX "photos_status_idx" ON "photos" USING btree ("status","updated_at");