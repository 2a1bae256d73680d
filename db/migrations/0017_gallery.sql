CREATE TABLE "gallery_items" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"part_type_id" uuid NOT NULL,
	"view_key" text NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"kind" text NOT NULL,
	"photo_id" uuid NOT NULL,
	"source_unit_id" uuid,
	"regions" jsonb NOT NULL,
	"defect_classes" text[] DEFAULT '{}'::text[] NOT NULL,
	"grade" text NOT NULL,
	"rubric_version_id" uuid,
	"caption" text DEFAULT '' NOT NULL,
	"revision" integer DEFAULT 0 NOT NULL,
	"created_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_by" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"published_by" uuid,
	"published_at" timestamp with time zone,
	"retired_at" timestamp with time zone,
	CONSTRAINT "gallery_items_workspace_id_key" UNIQUE("workspace_id","id"),
	CONSTRAINT "gallery_items_revision_nonnegative" CHECK ("gallery_items"."revision" >= 0),
	CONSTRAINT "gallery_items_caption_length" CHECK (length("gallery_items"."caption") <= 600),
	CONSTRAINT "gallery_items_published_fields" CHECK (("gallery_items"."status" <> 'draft' OR "gallery_items"."published_at" IS NULL) AND ("gallery_items"."status" <> 'published' OR "gallery_items"."published_at" IS NOT NULL)),
	CONSTRAINT "gallery_items_retired_fields" CHECK (("gallery_items"."status" = 'retired') = ("gallery_items"."retired_at" IS NOT NULL))
);
--> statement-breakpoint
ALTER TABLE "photos" ALTER COLUMN "unit_id" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "gallery_items" ADD CONSTRAINT "gallery_items_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "gallery_items" ADD CONSTRAINT "gallery_items_part_type_fk" FOREIGN KEY ("workspace_id","part_type_id") REFERENCES "public"."part_types"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "gallery_items" ADD CONSTRAINT "gallery_items_photo_fk" FOREIGN KEY ("workspace_id","photo_id") REFERENCES "public"."photos"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "gallery_items" ADD CONSTRAINT "gallery_items_source_unit_fk" FOREIGN KEY ("workspace_id","source_unit_id") REFERENCES "public"."units"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "gallery_items" ADD CONSTRAINT "gallery_items_rubric_version_fk" FOREIGN KEY ("workspace_id","rubric_version_id") REFERENCES "public"."rubric_versions"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "gallery_items" ADD CONSTRAINT "gallery_items_created_by_fk" FOREIGN KEY ("workspace_id","created_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "gallery_items" ADD CONSTRAINT "gallery_items_updated_by_fk" FOREIGN KEY ("workspace_id","updated_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "gallery_items" ADD CONSTRAINT "gallery_items_published_by_fk" FOREIGN KEY ("workspace_id","published_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "gallery_items_list_idx" ON "gallery_items" USING btree ("workspace_id","created_at" DESC NULLS LAST,"id" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "gallery_items_reference_idx" ON "gallery_items" USING btree ("workspace_id","part_type_id","view_key") WHERE "gallery_items"."status" = 'published';--> statement-breakpoint
CREATE INDEX "gallery_items_defect_classes_idx" ON "gallery_items" USING gin ("defect_classes");--> statement-breakpoint
CREATE INDEX "gallery_items_photo_idx" ON "gallery_items" USING btree ("workspace_id","photo_id");