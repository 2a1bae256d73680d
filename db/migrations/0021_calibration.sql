CREATE TABLE "calibration_assignments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"set_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"due_on" date NOT NULL,
	"assigned_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calibration_assignments_set_user_key" UNIQUE("set_id","user_id"),
	CONSTRAINT "calibration_assignments_workspace_id_key" UNIQUE("workspace_id","id")
);
--> statement-breakpoint
CREATE TABLE "calibration_attempts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"assignment_id" uuid NOT NULL,
	"set_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"status" text DEFAULT 'in_progress' NOT NULL,
	"answers" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"submitted_at" timestamp with time zone,
	"passed" boolean,
	"score" jsonb,
	CONSTRAINT "calibration_attempts_assignment_key" UNIQUE("assignment_id"),
	CONSTRAINT "calibration_attempts_workspace_id_key" UNIQUE("workspace_id","id"),
	CONSTRAINT "calibration_attempts_submitted_fields" CHECK (("calibration_attempts"."status" = 'submitted') = ("calibration_attempts"."submitted_at" IS NOT NULL) AND ("calibration_attempts"."submitted_at" IS NULL) = ("calibration_attempts"."score" IS NULL) AND ("calibration_attempts"."score" IS NULL) = ("calibration_attempts"."passed" IS NULL))
);
--> statement-breakpoint
CREATE TABLE "calibration_set_items" (
	"workspace_id" uuid NOT NULL,
	"set_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"gallery_item_id" uuid NOT NULL,
	"photo_id" uuid NOT NULL,
	"part_type_id" uuid NOT NULL,
	"view_key" text NOT NULL,
	"key_regions" jsonb NOT NULL,
	"key_grade" text NOT NULL,
	"key_caption" text NOT NULL,
	CONSTRAINT "calibration_set_items_pkey" PRIMARY KEY("set_id","position"),
	CONSTRAINT "calibration_set_items_item_key" UNIQUE("set_id","gallery_item_id"),
	CONSTRAINT "calibration_set_items_position" CHECK ("calibration_set_items"."position" BETWEEN 1 AND 50)
);
--> statement-breakpoint
CREATE TABLE "calibration_sets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"name" text NOT NULL,
	"min_grade_agreement" double precision NOT NULL,
	"min_mean_iou" double precision NOT NULL,
	"item_count" integer NOT NULL,
	"created_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calibration_sets_workspace_id_key" UNIQUE("workspace_id","id"),
	CONSTRAINT "calibration_sets_thresholds" CHECK ("calibration_sets"."min_grade_agreement" BETWEEN 0 AND 1 AND "calibration_sets"."min_mean_iou" BETWEEN 0 AND 1),
	CONSTRAINT "calibration_sets_item_count" CHECK ("calibration_sets"."item_count" BETWEEN 5 AND 50),
	CONSTRAINT "calibration_sets_name_length" CHECK (length("calibration_sets"."name") BETWEEN 1 AND 120)
);
--> statement-breakpoint
ALTER TABLE "calibration_assignments" ADD CONSTRAINT "calibration_assignments_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_assignments" ADD CONSTRAINT "calibration_assignments_set_fk" FOREIGN KEY ("workspace_id","set_id") REFERENCES "public"."calibration_sets"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_assignments" ADD CONSTRAINT "calibration_assignments_user_fk" FOREIGN KEY ("workspace_id","user_id") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_assignments" ADD CONSTRAINT "calibration_assignments_assigned_by_fk" FOREIGN KEY ("workspace_id","assigned_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_attempts" ADD CONSTRAINT "calibration_attempts_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_attempts" ADD CONSTRAINT "calibration_attempts_assignment_fk" FOREIGN KEY ("workspace_id","assignment_id") REFERENCES "public"."calibration_assignments"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_attempts" ADD CONSTRAINT "calibration_attempts_set_fk" FOREIGN KEY ("workspace_id","set_id") REFERENCES "public"."calibration_sets"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_attempts" ADD CONSTRAINT "calibration_attempts_user_fk" FOREIGN KEY ("workspace_id","user_id") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_set_items" ADD CONSTRAINT "calibration_set_items_set_fk" FOREIGN KEY ("workspace_id","set_id") REFERENCES "public"."calibration_sets"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_set_items" ADD CONSTRAINT "calibration_set_items_gallery_item_fk" FOREIGN KEY ("workspace_id","gallery_item_id") REFERENCES "public"."gallery_items"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_set_items" ADD CONSTRAINT "calibration_set_items_photo_fk" FOREIGN KEY ("workspace_id","photo_id") REFERENCES "public"."photos"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_set_items" ADD CONSTRAINT "calibration_set_items_part_type_fk" FOREIGN KEY ("workspace_id","part_type_id") REFERENCES "public"."part_types"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_sets" ADD CONSTRAINT "calibration_sets_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_sets" ADD CONSTRAINT "calibration_sets_created_by_fk" FOREIGN KEY ("workspace_id","created_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "calibration_assignments_user_idx" ON "calibration_assignments" USING btree ("workspace_id","user_id");--> statement-breakpoint
CREATE INDEX "calibration_attempts_set_idx" ON "calibration_attempts" USING btree ("workspace_id","set_id");--> statement-breakpoint
CREATE INDEX "calibration_set_items_photo_idx" ON "calibration_set_items" USING btree ("workspace_id","photo_id");--> statement-breakpoint
CREATE INDEX "calibration_set_items_gallery_item_idx" ON "calibration_set_items" USING btree ("workspace_id","gallery_item_id");--> statement-breakpoint
CREATE INDEX "calibration_sets_list_idx" ON "calibration_sets" USING btree ("workspace_id","created_at" DESC NULLS LAST);