CREATE TABLE "suggestion_decisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"photo_id" uuid NOT NULL,
	"model_id" uuid NOT NULL,
	"defect_class" text NOT NULL,
	"shape" jsonb NOT NULL,
	"score" real NOT NULL,
	"decision" text NOT NULL,
	"decided_by" uuid NOT NULL,
	"decided_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "suggestion_decisions_score_range" CHECK ("suggestion_decisions"."score" >= 0 AND "suggestion_decisions"."score" <= 1)
);
--> statement-breakpoint
CREATE TABLE "suggestion_models" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"model" jsonb NOT NULL,
	"class_counts" jsonb NOT NULL,
	"sources" jsonb NOT NULL,
	"evaluation" jsonb NOT NULL,
	"suggestable" jsonb NOT NULL,
	"in_use" boolean DEFAULT false NOT NULL,
	"decision" text NOT NULL,
	"training_ms" integer NOT NULL,
	"requested_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "suggestion_models_workspace_id_key" UNIQUE("workspace_id","id"),
	CONSTRAINT "suggestion_models_workspace_version_key" UNIQUE("workspace_id","version"),
	CONSTRAINT "suggestion_models_version_positive" CHECK ("suggestion_models"."version" >= 1)
);
--> statement-breakpoint
ALTER TABLE "suggestion_decisions" ADD CONSTRAINT "suggestion_decisions_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "suggestion_decisions" ADD CONSTRAINT "suggestion_decisions_photo_fk" FOREIGN KEY ("workspace_id","photo_id") REFERENCES "public"."photos"("workspace_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "suggestion_decisions" ADD CONSTRAINT "suggestion_decisions_model_fk" FOREIGN KEY ("workspace_id","model_id") REFERENCES "public"."suggestion_models"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "suggestion_decisions" ADD CONSTRAINT "suggestion_decisions_decided_by_fk" FOREIGN KEY ("workspace_id","decided_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "suggestion_models" ADD CONSTRAINT "suggestion_models_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "suggestion_models" ADD CONSTRAINT "suggestion_models_requested_by_fk" FOREIGN KEY ("workspace_id","requested_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "suggestion_decisions_photo_idx" ON "suggestion_decisions" USING btree ("workspace_id","photo_id");--> statement-breakpoint
CREATE INDEX "suggestion_decisions_dismissed_idx" ON "suggestion_decisions" USING btree ("workspace_id","decided_at") WHERE "suggestion_decisions"."decision" = 'dismissed';--> statement-breakpoint
CREATE UNIQUE INDEX "suggestion_models_one_in_use_idx" ON "suggestion_models" USING btree ("workspace_id") WHERE "suggestion_models"."in_use";