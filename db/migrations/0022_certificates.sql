CREATE TABLE "certificates" (
	"id" uuid PRIMARY KEY NOT NULL,
	"workspace_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"grade_id" uuid NOT NULL,
	"short_code" text NOT NULL,
	"content" jsonb NOT NULL,
	"content_hash" text NOT NULL,
	"link_expires_at" timestamp with time zone NOT NULL,
	"issued_by" uuid NOT NULL,
	"issued_at" timestamp with time zone NOT NULL,
	"revoked_at" timestamp with time zone,
	"revoked_by" uuid,
	"revoke_reason" text,
	CONSTRAINT "certificates_revocation_complete" CHECK (("certificates"."revoked_at" IS NULL) = ("certificates"."revoked_by" IS NULL) AND ("certificates"."revoked_at" IS NULL) = ("certificates"."revoke_reason" IS NULL))
);
--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_grade_id_grades_id_fk" FOREIGN KEY ("grade_id") REFERENCES "public"."grades"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_unit_fk" FOREIGN KEY ("workspace_id","unit_id") REFERENCES "public"."units"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_issued_by_fk" FOREIGN KEY ("workspace_id","issued_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_revoked_by_fk" FOREIGN KEY ("workspace_id","revoked_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "certificates_short_code_key" ON "certificates" USING btree ("short_code");--> statement-breakpoint
CREATE INDEX "certificates_unit_idx" ON "certificates" USING btree ("workspace_id","unit_id","issued_at");