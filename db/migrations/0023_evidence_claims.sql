CREATE TABLE "claims" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"evidence_pack_id" uuid NOT NULL,
	"supplier_id" uuid NOT NULL,
	"lot_id" uuid NOT NULL,
	"reference" text NOT NULL,
	"status" text DEFAULT 'open' NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"updated_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "evidence_packs" (
	"id" uuid PRIMARY KEY NOT NULL,
	"workspace_id" uuid NOT NULL,
	"lot_id" uuid NOT NULL,
	"supplier_id" uuid NOT NULL,
	"email_id" uuid NOT NULL,
	"to_address" text NOT NULL,
	"subject" text NOT NULL,
	"body" text NOT NULL,
	"attachments" jsonb NOT NULL,
	"delivery" text NOT NULL,
	"link_expires_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	"revoked_by" uuid,
	"created_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "evidence_packs_workspace_id_key" UNIQUE("workspace_id","id"),
	CONSTRAINT "evidence_packs_link_expiry" CHECK (("evidence_packs"."delivery" = 'link') = ("evidence_packs"."link_expires_at" IS NOT NULL)),
	CONSTRAINT "evidence_packs_revocation_complete" CHECK (("evidence_packs"."revoked_at" IS NULL) = ("evidence_packs"."revoked_by" IS NULL))
);
--> statement-breakpoint
ALTER TABLE "claims" ADD CONSTRAINT "claims_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "claims" ADD CONSTRAINT "claims_evidence_pack_fk" FOREIGN KEY ("workspace_id","evidence_pack_id") REFERENCES "public"."evidence_packs"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "claims" ADD CONSTRAINT "claims_supplier_fk" FOREIGN KEY ("workspace_id","supplier_id") REFERENCES "public"."suppliers"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "claims" ADD CONSTRAINT "claims_lot_fk" FOREIGN KEY ("workspace_id","lot_id") REFERENCES "public"."lots"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "claims" ADD CONSTRAINT "claims_updated_by_fk" FOREIGN KEY ("workspace_id","updated_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evidence_packs" ADD CONSTRAINT "evidence_packs_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evidence_packs" ADD CONSTRAINT "evidence_packs_email_id_outgoing_emails_id_fk" FOREIGN KEY ("email_id") REFERENCES "public"."outgoing_emails"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evidence_packs" ADD CONSTRAINT "evidence_packs_lot_fk" FOREIGN KEY ("workspace_id","lot_id") REFERENCES "public"."lots"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evidence_packs" ADD CONSTRAINT "evidence_packs_supplier_fk" FOREIGN KEY ("workspace_id","supplier_id") REFERENCES "public"."suppliers"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evidence_packs" ADD CONSTRAINT "evidence_packs_created_by_fk" FOREIGN KEY ("workspace_id","created_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evidence_packs" ADD CONSTRAINT "evidence_packs_revoked_by_fk" FOREIGN KEY ("workspace_id","revoked_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "claims_evidence_pack_key" ON "claims" USING btree ("evidence_pack_id");--> statement-breakpoint
CREATE UNIQUE INDEX "claims_workspace_reference_key" ON "claims" USING btree ("workspace_id",lower("reference"));--> statement-breakpoint
CREATE INDEX "claims_supplier_idx" ON "claims" USING btree ("workspace_id","supplier_id","created_at");--> statement-breakpoint
CREATE INDEX "evidence_packs_lot_idx" ON "evidence_packs" USING btree ("workspace_id","lot_id","created_at");