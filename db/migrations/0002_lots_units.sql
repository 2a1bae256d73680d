CREATE TABLE "checklist_results" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"item_id" text NOT NULL,
	"value" jsonb NOT NULL,
	"passed" boolean NOT NULL,
	"failure_reason" text,
	"severity_on_fail" text NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"recorded_by" uuid NOT NULL,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "lots" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"supplier_id" uuid NOT NULL,
	"part_type_id" uuid NOT NULL,
	"purchase_ref" text NOT NULL,
	"model_family" text DEFAULT '' NOT NULL,
	"quantity" integer NOT NULL,
	"received_on" date NOT NULL,
	"due_on" date NOT NULL,
	"inspection_level" text NOT NULL,
	"aql_critical" real,
	"aql_major" real NOT NULL,
	"aql_minor" real NOT NULL,
	"inspection_severity" text NOT NULL,
	"plan" jsonb NOT NULL,
	"sample_seed" text,
	"status" text DEFAULT 'open' NOT NULL,
	"verdict" text,
	"disposition" text,
	"disposition_reason" text,
	"decided_by" uuid,
	"decided_at" timestamp with time zone,
	"created_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "lots_quantity_positive" CHECK ("lots"."quantity" > 0)
);
--> statement-breakpoint
CREATE TABLE "part_types" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"slug" text NOT NULL,
	"name" text NOT NULL,
	"category" text NOT NULL,
	"model_family" text DEFAULT '' NOT NULL,
	"views" jsonb NOT NULL,
	"defect_classes" jsonb NOT NULL,
	"checklist" jsonb NOT NULL,
	"nominal_size_mm" jsonb,
	"panel_resolution" jsonb,
	"inspect_all" boolean DEFAULT false NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "units" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"lot_id" uuid NOT NULL,
	"sample_index" integer NOT NULL,
	"serial" text,
	"status" text DEFAULT 'queued' NOT NULL,
	"part_type_id" uuid NOT NULL,
	"supplier_id" uuid NOT NULL,
	"lot_due_on" date NOT NULL,
	"lot_received_on" date NOT NULL,
	"lot_created_at" timestamp with time zone NOT NULL,
	"lease_holder_id" uuid,
	"lease_expires_at" timestamp with time zone,
	"claimed_at" timestamp with time zone,
	"graded_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "checklist_results" ADD CONSTRAINT "checklist_results_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checklist_results" ADD CONSTRAINT "checklist_results_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checklist_results" ADD CONSTRAINT "checklist_results_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_supplier_id_suppliers_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."suppliers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_part_type_id_part_types_id_fk" FOREIGN KEY ("part_type_id") REFERENCES "public"."part_types"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_decided_by_users_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_types" ADD CONSTRAINT "part_types_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_part_type_id_part_types_id_fk" FOREIGN KEY ("part_type_id") REFERENCES "public"."part_types"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_supplier_id_suppliers_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."suppliers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_lease_holder_id_users_id_fk" FOREIGN KEY ("lease_holder_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "checklist_results_unit_item_key" ON "checklist_results" USING btree ("unit_id","item_id");--> statement-breakpoint
CREATE INDEX "lots_workspace_idx" ON "lots" USING btree ("workspace_id","created_at");--> statement-breakpoint
CREATE INDEX "lots_history_idx" ON "lots" USING btree ("workspace_id","supplier_id","part_type_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "part_types_workspace_slug_key" ON "part_types" USING btree ("workspace_id","slug");--> statement-breakpoint
CREATE UNIQUE INDEX "units_lot_sample_key" ON "units" USING btree ("lot_id","sample_index");--> statement-breakpoint
CREATE UNIQUE INDEX "units_lot_serial_key" ON "units" USING btree ("lot_id","serial") WHERE "units"."serial" IS NOT NULL;--> statement-breakpoint
CREATE INDEX "units_queue_idx" ON "units" USING btree ("workspace_id","status","lot_due_on","lot_received_on","lot_created_at","lot_id","sample_index","id");--> statement-breakpoint
CREATE INDEX "units_lot_idx" ON "units" USING btree ("lot_id","sample_index");