CREATE TABLE "region_sets" (
	"photo_id" uuid PRIMARY KEY NOT NULL,
	"workspace_id" uuid NOT NULL,
	"version" integer DEFAULT 0 NOT NULL,
	"updated_by" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "region_sets_version_nonnegative" CHECK ("region_sets"."version" >= 0)
);
--> statement-breakpoint
CREATE TABLE "regions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"photo_id" uuid NOT NULL,
	"client_id" text NOT NULL,
	"role" text NOT NULL,
	"defect_class" text,
	"shape" jsonb,
	"ruler" jsonb,
	"author_id" uuid NOT NULL,
	"version_written" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "regions_role_fields" CHECK (("regions"."role" = 'defect' AND "regions"."defect_class" IS NOT NULL AND "regions"."shape" IS NOT NULL AND "regions"."ruler" IS NULL)
       OR ("regions"."role" = 'surface' AND "regions"."defect_class" IS NULL AND "regions"."shape" IS NOT NULL AND "regions"."ruler" IS NULL)
       OR ("regions"."role" = 'ruler' AND "regions"."defect_class" IS NULL AND "regions"."shape" IS NULL AND "regions"."ruler" IS NOT NULL))
);
--> statement-breakpoint
CREATE TABLE "grades" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"proposed_grade" text NOT NULL,
	"final_grade" text NOT NULL,
	"override_reason" text,
	"rubric_version_id" uuid NOT NULL,
	"measurement_ids" uuid[] NOT NULL,
	"explanation" jsonb NOT NULL,
	"regions_versions" jsonb NOT NULL,
	"graded_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "grades_override_reason" CHECK ("grades"."final_grade" = "grades"."proposed_grade" OR ("grades"."override_reason" IS NOT NULL AND length(btrim("grades"."override_reason")) > 0)),
	CONSTRAINT "grades_override_kind_reason" CHECK ("grades"."kind" <> 'override' OR ("grades"."override_reason" IS NOT NULL AND length(btrim("grades"."override_reason")) > 0))
);
--> statement-breakpoint
CREATE TABLE "measurements" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"photo_id" uuid,
	"unit_measurement_id" uuid,
	"rubric_version_id" uuid NOT NULL,
	"regions_versions" jsonb NOT NULL,
	"result" jsonb NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "rubric_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"part_type_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"rubric" jsonb NOT NULL,
	"based_on_version" integer,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_by" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"published_by" uuid,
	"published_at" timestamp with time zone,
	CONSTRAINT "rubric_versions_version_positive" CHECK ("rubric_versions"."version" >= 1),
	CONSTRAINT "rubric_versions_published_fields" CHECK (("rubric_versions"."status" = 'published') = ("rubric_versions"."published_at" IS NOT NULL))
);
--> statement-breakpoint
ALTER TABLE "region_sets" ADD CONSTRAINT "region_sets_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "region_sets" ADD CONSTRAINT "region_sets_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "region_sets" ADD CONSTRAINT "region_sets_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "regions" ADD CONSTRAINT "regions_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "regions" ADD CONSTRAINT "regions_photo_id_region_sets_photo_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."region_sets"("photo_id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "regions" ADD CONSTRAINT "regions_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "grades" ADD CONSTRAINT "grades_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "grades" ADD CONSTRAINT "grades_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "grades" ADD CONSTRAINT "grades_rubric_version_id_rubric_versions_id_fk" FOREIGN KEY ("rubric_version_id") REFERENCES "public"."rubric_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "grades" ADD CONSTRAINT "grades_graded_by_users_id_fk" FOREIGN KEY ("graded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_rubric_version_id_rubric_versions_id_fk" FOREIGN KEY ("rubric_version_id") REFERENCES "public"."rubric_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rubric_versions" ADD CONSTRAINT "rubric_versions_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rubric_versions" ADD CONSTRAINT "rubric_versions_part_type_id_part_types_id_fk" FOREIGN KEY ("part_type_id") REFERENCES "public"."part_types"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rubric_versions" ADD CONSTRAINT "rubric_versions_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rubric_versions" ADD CONSTRAINT "rubric_versions_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rubric_versions" ADD CONSTRAINT "rubric_versions_published_by_users_id_fk" FOREIGN KEY ("published_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "region_sets_workspace_idx" ON "region_sets" USING btree ("workspace_id");--> statement-breakpoint
CREATE UNIQUE INDEX "regions_photo_client_key" ON "regions" USING btree ("photo_id","client_id");--> statement-breakpoint
CREATE INDEX "regions_workspace_photo_idx" ON "regions" USING btree ("workspace_id","photo_id");--> statement-breakpoint
CREATE INDEX "grades_unit_idx" ON "grades" USING btree ("workspace_id","unit_id","created_at");--> statement-breakpoint
CREATE INDEX "measurements_unit_idx" ON "measurements" USING btree ("workspace_id","unit_id","created_at");--> statement-breakpoint
CREATE INDEX "measurements_parent_idx" ON "measurements" USING btree ("unit_measurement_id");--> statement-breakpoint
CREATE UNIQUE INDEX "rubric_versions_part_type_version_key" ON "rubric_versions" USING btree ("part_type_id","version");--> statement-breakpoint
CREATE UNIQUE INDEX "rubric_versions_one_draft_key" ON "rubric_versions" USING btree ("part_type_id") WHERE "rubric_versions"."status" = 'draft';--> statement-breakpoint
CREATE INDEX "rubric_versions_workspace_idx" ON "rubric_versions" USING btree ("workspace_id","part_type_id");