ALTER TABLE "activity_log" DROP CONSTRAINT "activity_log_actor_id_users_id_fk";--> statement-breakpoint
ALTER TABLE "auth_tokens" DROP CONSTRAINT "auth_tokens_user_id_users_id_fk";--> statement-breakpoint
ALTER TABLE "checklist_results" DROP CONSTRAINT "checklist_results_unit_id_units_id_fk";--> statement-breakpoint
ALTER TABLE "checklist_results" DROP CONSTRAINT "checklist_results_recorded_by_users_id_fk";--> statement-breakpoint
ALTER TABLE "inspection_schemes" DROP CONSTRAINT "inspection_schemes_supplier_id_suppliers_id_fk";--> statement-breakpoint
ALTER TABLE "inspection_schemes" DROP CONSTRAINT "inspection_schemes_part_type_id_part_types_id_fk";--> statement-breakpoint
ALTER TABLE "inspection_schemes" DROP CONSTRAINT "inspection_schemes_updated_by_users_id_fk";--> statement-breakpoint
ALTER TABLE "lots" DROP CONSTRAINT "lots_supplier_id_suppliers_id_fk";--> statement-breakpoint
ALTER TABLE "lots" DROP CONSTRAINT "lots_part_type_id_part_types_id_fk";--> statement-breakpoint
ALTER TABLE "lots" DROP CONSTRAINT "lots_decided_by_users_id_fk";--> statement-breakpoint
ALTER TABLE "lots" DROP CONSTRAINT "lots_created_by_users_id_fk";--> statement-breakpoint
ALTER TABLE "units" DROP CONSTRAINT "units_lot_id_lots_id_fk";--> statement-breakpoint
ALTER TABLE "units" DROP CONSTRAINT "units_part_type_id_part_types_id_fk";--> statement-breakpoint
ALTER TABLE "units" DROP CONSTRAINT "units_supplier_id_suppliers_id_fk";--> statement-breakpoint
ALTER TABLE "units" DROP CONSTRAINT "units_lease_holder_id_users_id_fk";--> statement-breakpoint
ALTER TABLE "photos" DROP CONSTRAINT "photos_unit_id_units_id_fk";--> statement-breakpoint
ALTER TABLE "photos" DROP CONSTRAINT "photos_uploaded_by_users_id_fk";--> statement-breakpoint
ALTER TABLE "region_sets" DROP CONSTRAINT "region_sets_photo_id_photos_id_fk";--> statement-breakpoint
ALTER TABLE "region_sets" DROP CONSTRAINT "region_sets_updated_by_users_id_fk";--> statement-breakpoint
ALTER TABLE "regions" DROP CONSTRAINT "regions_photo_id_region_sets_photo_id_fk";--> statement-breakpoint
ALTER TABLE "regions" DROP CONSTRAINT "regions_author_id_users_id_fk";--> statement-breakpoint
ALTER TABLE "grades" DROP CONSTRAINT "grades_unit_id_units_id_fk";--> statement-breakpoint
ALTER TABLE "grades" DROP CONSTRAINT "grades_rubric_version_id_rubric_versions_id_fk";--> statement-breakpoint
ALTER TABLE "grades" DROP CONSTRAINT "grades_graded_by_users_id_fk";--> statement-breakpoint
ALTER TABLE "measurements" DROP CONSTRAINT "measurements_unit_id_units_id_fk";--> statement-breakpoint
ALTER TABLE "measurements" DROP CONSTRAINT "measurements_photo_id_photos_id_fk";--> statement-breakpoint
ALTER TABLE "measurements" DROP CONSTRAINT "measurements_rubric_version_id_rubric_versions_id_fk";--> statement-breakpoint
ALTER TABLE "measurements" DROP CONSTRAINT "measurements_created_by_users_id_fk";--> statement-breakpoint
ALTER TABLE "rubric_versions" DROP CONSTRAINT "rubric_versions_part_type_id_part_types_id_fk";--> statement-breakpoint
ALTER TABLE "rubric_versions" DROP CONSTRAINT "rubric_versions_created_by_users_id_fk";--> statement-breakpoint
ALTER TABLE "rubric_versions" DROP CONSTRAINT "rubric_versions_updated_by_users_id_fk";--> statement-breakpoint
ALTER TABLE "rubric_versions" DROP CONSTRAINT "rubric_versions_published_by_users_id_fk";--> statement-breakpoint
ALTER TABLE "grades" ADD COLUMN "idempotency_key" uuid;--> statement-breakpoint
ALTER TABLE "rubric_versions" ADD COLUMN "revision" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
-- The (workspace_id, id) keys first: the composite foreign keys below reference them.
ALTER TABLE "suppliers" ADD CONSTRAINT "suppliers_workspace_id_key" UNIQUE("workspace_id","id");--> statement-breakpoint
ALTER TABLE "users" ADD CONSTRAINT "users_workspace_id_key" UNIQUE("workspace_id","id");--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_workspace_id_key" UNIQUE("workspace_id","id");--> statement-breakpoint
ALTER TABLE "part_types" ADD CONSTRAINT "part_types_workspace_id_key" UNIQUE("workspace_id","id");--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_workspace_id_key" UNIQUE("workspace_id","id");--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_workspace_id_key" UNIQUE("workspace_id","id");--> statement-breakpoint
ALTER TABLE "region_sets" ADD CONSTRAINT "region_sets_workspace_photo_key" UNIQUE("workspace_id","photo_id");--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_workspace_id_key" UNIQUE("workspace_id","id");--> statement-breakpoint
ALTER TABLE "rubric_versions" ADD CONSTRAINT "rubric_versions_workspace_id_key" UNIQUE("workspace_id","id");--> statement-breakpoint
ALTER TABLE "activity_log" ADD CONSTRAINT "activity_log_actor_fk" FOREIGN KEY ("workspace_id","actor_id") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "auth_tokens" ADD CONSTRAINT "auth_tokens_user_fk" FOREIGN KEY ("workspace_id","user_id") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checklist_results" ADD CONSTRAINT "checklist_results_unit_fk" FOREIGN KEY ("workspace_id","unit_id") REFERENCES "public"."units"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checklist_results" ADD CONSTRAINT "checklist_results_recorded_by_fk" FOREIGN KEY ("workspace_id","recorded_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspection_schemes" ADD CONSTRAINT "inspection_schemes_supplier_fk" FOREIGN KEY ("workspace_id","supplier_id") REFERENCES "public"."suppliers"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspection_schemes" ADD CONSTRAINT "inspection_schemes_part_type_fk" FOREIGN KEY ("workspace_id","part_type_id") REFERENCES "public"."part_types"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspection_schemes" ADD CONSTRAINT "inspection_schemes_updated_by_fk" FOREIGN KEY ("workspace_id","updated_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_supplier_fk" FOREIGN KEY ("workspace_id","supplier_id") REFERENCES "public"."suppliers"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_part_type_fk" FOREIGN KEY ("workspace_id","part_type_id") REFERENCES "public"."part_types"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_decided_by_fk" FOREIGN KEY ("workspace_id","decided_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_created_by_fk" FOREIGN KEY ("workspace_id","created_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_lot_fk" FOREIGN KEY ("workspace_id","lot_id") REFERENCES "public"."lots"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_part_type_fk" FOREIGN KEY ("workspace_id","part_type_id") REFERENCES "public"."part_types"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_supplier_fk" FOREIGN KEY ("workspace_id","supplier_id") REFERENCES "public"."suppliers"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_lease_holder_fk" FOREIGN KEY ("workspace_id","lease_holder_id") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_unit_fk" FOREIGN KEY ("workspace_id","unit_id") REFERENCES "public"."units"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_uploaded_by_fk" FOREIGN KEY ("workspace_id","uploaded_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "region_sets" ADD CONSTRAINT "region_sets_photo_fk" FOREIGN KEY ("workspace_id","photo_id") REFERENCES "public"."photos"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "region_sets" ADD CONSTRAINT "region_sets_updated_by_fk" FOREIGN KEY ("workspace_id","updated_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "regions" ADD CONSTRAINT "regions_region_set_fk" FOREIGN KEY ("workspace_id","photo_id") REFERENCES "public"."region_sets"("workspace_id","photo_id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "regions" ADD CONSTRAINT "regions_author_fk" FOREIGN KEY ("workspace_id","author_id") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "grades" ADD CONSTRAINT "grades_unit_fk" FOREIGN KEY ("workspace_id","unit_id") REFERENCES "public"."units"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "grades" ADD CONSTRAINT "grades_rubric_version_fk" FOREIGN KEY ("workspace_id","rubric_version_id") REFERENCES "public"."rubric_versions"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "grades" ADD CONSTRAINT "grades_graded_by_fk" FOREIGN KEY ("workspace_id","graded_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_unit_fk" FOREIGN KEY ("workspace_id","unit_id") REFERENCES "public"."units"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_photo_fk" FOREIGN KEY ("workspace_id","photo_id") REFERENCES "public"."photos"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_parent_fk" FOREIGN KEY ("workspace_id","unit_measurement_id") REFERENCES "public"."measurements"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_rubric_version_fk" FOREIGN KEY ("workspace_id","rubric_version_id") REFERENCES "public"."rubric_versions"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_created_by_fk" FOREIGN KEY ("workspace_id","created_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rubric_versions" ADD CONSTRAINT "rubric_versions_part_type_fk" FOREIGN KEY ("workspace_id","part_type_id") REFERENCES "public"."part_types"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rubric_versions" ADD CONSTRAINT "rubric_versions_created_by_fk" FOREIGN KEY ("workspace_id","created_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rubric_versions" ADD CONSTRAINT "rubric_versions_updated_by_fk" FOREIGN KEY ("workspace_id","updated_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rubric_versions" ADD CONSTRAINT "rubric_versions_published_by_fk" FOREIGN KEY ("workspace_id","published_by") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "grades_unit_idempotency_key" ON "grades" USING btree ("unit_id","idempotency_key") WHERE "grades"."idempotency_key" IS NOT NULL;
