ALTER TABLE "suppliers" ADD COLUMN "promised_grade" text;--> statement-breakpoint
ALTER TABLE "workspaces" ADD COLUMN "time_zone" text DEFAULT 'UTC' NOT NULL;--> statement-breakpoint
ALTER TABLE "lots" ADD COLUMN "promised_grade" text DEFAULT 'A' NOT NULL;--> statement-breakpoint
ALTER TABLE "part_types" ADD COLUMN "promised_grade" text DEFAULT 'A' NOT NULL;