CREATE TABLE "inspection_schemes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"supplier_id" uuid NOT NULL,
	"part_type_id" uuid NOT NULL,
	"reduced_allowed" boolean DEFAULT false NOT NULL,
	"steady_production" boolean DEFAULT true NOT NULL,
	"resumed_after_lot_ids" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"updated_by" uuid NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "lots" ADD COLUMN "sample_draw" jsonb;--> statement-breakpoint
ALTER TABLE "lots" ADD COLUMN "decision_counts" jsonb;--> statement-breakpoint
ALTER TABLE "units" ADD COLUMN "placeholder" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "inspection_schemes" ADD CONSTRAINT "inspection_schemes_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspection_schemes" ADD CONSTRAINT "inspection_schemes_supplier_id_suppliers_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."suppliers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspection_schemes" ADD CONSTRAINT "inspection_schemes_part_type_id_part_types_id_fk" FOREIGN KEY ("part_type_id") REFERENCES "public"."part_types"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspection_schemes" ADD CONSTRAINT "inspection_schemes_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "inspection_schemes_key" ON "inspection_schemes" USING btree ("workspace_id","supplier_id","part_type_id");
