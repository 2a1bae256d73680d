CREATE TABLE "recheck_draws" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"trigger" text NOT NULL,
	"trigger_grade_id" uuid,
	"seed" text NOT NULL,
	"algorithm" text NOT NULL,
	"input" jsonb NOT NULL,
	"outcome" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "recheck_draws_workspace_id_key" UNIQUE("workspace_id","id")
);
--> statement-breakpoint
CREATE TABLE "recheck_region_sets" (
	"recheck_id" uuid NOT NULL,
	"photo_id" uuid NOT NULL,
	"workspace_id" uuid NOT NULL,
	"payload" jsonb NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"updated_by" uuid NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "recheck_region_sets_pkey" PRIMARY KEY("recheck_id","photo_id")
);
--> statement-breakpoint
CREATE TABLE "rechecks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"grade_id" uuid NOT NULL,
	"first_grader_id" uuid NOT NULL,
	"part_type_id" uuid NOT NULL,
	"rubric_version_id" uuid NOT NULL,
	"reason" text NOT NULL,
	"draw_id" uuid,
	"sent_by" uuid,
	"sent_note" text,
	"status" text DEFAULT 'waiting' NOT NULL,
	"lease_holder_id" uuid,
	"lease_expires_at" timestamp with time zone,
	"claimed_at" timestamp with time zone,
	"auditor_id" uuid,
	"measurement" jsonb,
	"proposed_grade" text,
	"recheck_grade" text,
	"override_reason" text,
	"not_blind" boolean DEFAULT false NOT NULL,
	"comparison" jsonb,
	"adjudication_reasons" jsonb,
	"submitted_at" timestamp with time zone,
	"adjudicated_by" uuid,
	"adjudication_choice" text,
	"adjudication_reason" text,
	"adjudication_grade_id" uuid,
	"adjudicated_at" timestamp with time zone,
	"decided_lot_affected" boolean DEFAULT false NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "rechecks_workspace_id_key" UNIQUE("workspace_id","id"),
	CONSTRAINT "rechecks_drawn_or_sent" CHECK (("rechecks"."reason" = 'by_hand') = ("rechecks"."sent_by" IS NOT NULL) AND ("rechecks"."reason" = 'by_hand' OR "rechecks"."draw_id" IS NOT NULL)),
	CONSTRAINT "rechecks_submission_fields" CHECK (("rechecks"."status" = 'waiting') = ("rechecks"."submitted_at" IS NULL) AND ("rechecks"."submitted_at" IS NULL OR ("rechecks"."auditor_id" IS NOT NULL AND "rechecks"."recheck_grade" IS NOT NULL AND "rechecks"."proposed_grade" IS NOT NULL AND "rechecks"."comparison" IS NOT NULL))),
	CONSTRAINT "rechecks_override_reason" CHECK ("rechecks"."recheck_grade" IS NULL OR "rechecks"."recheck_grade" = "rechecks"."proposed_grade" OR length(btrim(coalesce("rechecks"."override_reason", ''))) > 0),
	CONSTRAINT "rechecks_adjudication_fields" CHECK (("rechecks"."status" = 'settled') = ("rechecks"."adjudicated_at" IS NOT NULL) AND ("rechecks"."adjudicated_at" IS NULL OR ("rechecks"."adjudicated_by" IS NOT NULL AND "rechecks"."adjudication_grade_id" IS NOT NULL AND length(btrim(coalesce("rechecks"."adjudication_reason", ''))) > 0)))
);
--> statement-breakpoint
CREATE TABLE "unit_openings" (
	"workspace_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"first_opened_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_opened_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "unit_openings_pkey" PRIMARY KEY("unit_id","user_id")
);
--> statement-breakpoint
ALTER TABLE "workspaces" ADD COLUMN "recheck_settings" jsonb;--> statement-breakpoint
ALTER TABLE "grades" ADD CONSTRAINT "grades_workspace_id_key" UNIQUE("workspace_id","id");--> statement-breakpoint
ALTER TABLE "recheck_draws" ADD CONSTRAINT "recheck_draws_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recheck_region_sets" ADD CONSTRAINT "recheck_region_sets_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recheck_region_sets" ADD CONSTRAINT "recheck_region_sets_recheck_fk" FOREIGN KEY ("workspace_id","recheck_id") REFERENCES "public"."rechecks"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recheck_region_sets" ADD CONSTRAINT "recheck_region_sets_photo_fk" FOREIGN KEY ("workspace_id","photo_id") REFERENCES "public"."photos"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recheck_region_sets" ADD CONSTRAINT "recheck_region_sets_updated_by_fk" FOREIGN KEY ("workspace_id","updated_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_unit_fk" FOREIGN KEY ("workspace_id","unit_id") REFERENCES "public"."units"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_grade_fk" FOREIGN KEY ("workspace_id","grade_id") REFERENCES "public"."grades"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_first_grader_fk" FOREIGN KEY ("workspace_id","first_grader_id") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_part_type_fk" FOREIGN KEY ("workspace_id","part_type_id") REFERENCES "public"."part_types"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_rubric_version_fk" FOREIGN KEY ("workspace_id","rubric_version_id") REFERENCES "public"."rubric_versions"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_draw_fk" FOREIGN KEY ("workspace_id","draw_id") REFERENCES "public"."recheck_draws"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_sent_by_fk" FOREIGN KEY ("workspace_id","sent_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_lease_holder_fk" FOREIGN KEY ("workspace_id","lease_holder_id") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_auditor_fk" FOREIGN KEY ("workspace_id","auditor_id") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_adjudicated_by_fk" FOREIGN KEY ("workspace_id","adjudicated_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_adjudication_grade_fk" FOREIGN KEY ("workspace_id","adjudication_grade_id") REFERENCES "public"."grades"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_openings" ADD CONSTRAINT "unit_openings_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_openings" ADD CONSTRAINT "unit_openings_unit_fk" FOREIGN KEY ("workspace_id","unit_id") REFERENCES "public"."units"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_openings" ADD CONSTRAINT "unit_openings_user_fk" FOREIGN KEY ("workspace_id","user_id") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "recheck_draws_workspace_idx" ON "recheck_draws" USING btree ("workspace_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "rechecks_grade_key" ON "rechecks" USING btree ("grade_id");--> statement-breakpoint
CREATE INDEX "rechecks_waiting_idx" ON "rechecks" USING btree ("workspace_id","created_at","id") WHERE "rechecks"."status" = 'waiting';--> statement-breakpoint
CREATE INDEX "rechecks_unit_idx" ON "rechecks" USING btree ("workspace_id","unit_id");--> statement-breakpoint
CREATE INDEX "rechecks_grader_idx" ON "rechecks" USING btree ("workspace_id","first_grader_id","created_at");--> statement-breakpoint
CREATE INDEX "grades_grader_idx" ON "grades" USING btree ("workspace_id","graded_by","created_at");