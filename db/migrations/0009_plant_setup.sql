CREATE TABLE `company_settings` (
	`id` text PRIMARY KEY NOT NULL,
	`company_name` text NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text
);
--> statement-breakpoint
DROP INDEX `cleanliness_specs_code_unique`;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `customer` text;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `document_number` text;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `revision` text DEFAULT '1' NOT NULL;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `status` text DEFAULT 'in_force' NOT NULL;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `supersedes_id` text;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `superseded_at` text;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `source_file_id` text;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `extra_requirements` text;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `customer_approves_changes` integer DEFAULT false NOT NULL;--> statement-breakpoint
CREATE UNIQUE INDEX `cleanliness_specs_code_revision_uq` ON `cleanliness_specs` (`code`,`revision`);--> statement-breakpoint
CREATE INDEX `cleanliness_specs_status_idx` ON `cleanliness_specs` (`status`);--> statement-breakpoint
ALTER TABLE `part_families` ADD `part_numbers` text DEFAULT '[]' NOT NULL;--> statement-breakpoint
ALTER TABLE `part_families` ADD `wetted_area_method` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `wetted_area_note` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `drawing_number` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `drawing_revision` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `customer` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `updated_at` text;--> statement-breakpoint
ALTER TABLE `requalification_intervals` ADD `basis` text;--> statement-breakpoint
ALTER TABLE `requalification_intervals` ADD `qualified_by` text REFERENCES users(id);--> statement-breakpoint
ALTER TABLE `test_runs` ADD `spec_id` text REFERENCES cleanliness_specs(id);